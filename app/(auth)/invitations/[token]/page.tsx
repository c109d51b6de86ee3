import type { Metadata } from "next";
import Link from "next/link";
import { currentUser } from "@/lib/auth/session";
import { invitationForToken } from "@/lib/dal/invitations";
import { AcceptInvitationForm } from "./_components/accept-invitation-form";
import { formatDateTime } from "@/lib/format/dates";

export const metadata: Metadata = { title: "Accept an invitation" };

const roleWords = { proposer: "proposer", reviewer: "reviewer", chair: "chair" } as const;

const closed = {
  accepted: "This invitation was already used. Sign in with your account to reach the board.",
  revoked: "This invitation was withdrawn. Ask the board's chair for a new one.",
  expired: "This invitation has expired. Ask the board's chair for a new one.",
} as const;

export default async function AcceptInvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const invitation = await invitationForToken(decodeURIComponent(token));
  const user = invitation?.hasAccount ? await currentUser() : null;
  const signedInAsInvitee = Boolean(user && invitation && user.email.toLowerCase() === invitation.email.toLowerCase());
  return (
    <div className="mx-auto max-w-lg rounded-panel border border-ink-200 bg-white p-6 shadow-panel">
      {!invitation ? (
        <>
          <h1 className="mb-2 text-xl font-bold">Invitation not found</h1>
          <p className="text-ink-700">
            This link does not match an invitation. Copy the whole address from the e-mail, or ask the board&apos;s chair for a new one.
          </p>
        </>
      ) : invitation.status !== "pending" ? (
        <>
          <h1 className="mb-2 text-xl font-bold">This invitation can no longer be used</h1>
          <p role="alert" className="text-ink-700">
            {closed[invitation.status]}
          </p>
          <Link href="/sign-in" className="mt-4 inline-block font-semibold text-trajectory-700 underline">
            Go to sign-in
          </Link>
        </>
      ) : (
        <>
          <p className="text-sm font-semibold uppercase tracking-widest text-trajectory-600">Invitation</p>
          <h1 className="mb-2 text-xl font-bold">Join the {invitation.boardName}</h1>
          <p className="mb-4 text-ink-700">
            You are invited as <strong>{roleWords[invitation.role]}</strong>. The invitation works once and is open until {formatDateTime(invitation.expiresAt)}
            .
          </p>
          {invitation.hasAccount && !signedInAsInvitee ? (
            <p className="text-ink-700">
              A VisViva account with <strong>{invitation.email}</strong> already exists. To accept,{" "}
              <Link href={`/sign-in?callbackUrl=${encodeURIComponent(`/invitations/${token}`)}`} className="font-semibold text-trajectory-700 underline">
                sign in as {invitation.email}
              </Link>
              {user ? " (you are signed in as someone else: sign out first)" : ""}, then come back to this page through the same link.
            </p>
          ) : (
            <AcceptInvitationForm
              token={decodeURIComponent(token)}
              email={invitation.email}
              suggestedName={invitation.name}
              hasAccount={invitation.hasAccount}
            />
          )}
        </>
      )}
    </div>
  );
}
