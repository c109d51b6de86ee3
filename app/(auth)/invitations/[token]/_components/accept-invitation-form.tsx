"use client";
import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { ActionNotice, SubmitButton, TextField, useActionForm } from "@/components/ui/form-controls";
import { acceptInvitationAction } from "../actions";

export function AcceptInvitationForm({
  token,
  email,
  suggestedName,
  hasAccount,
}: {
  token: string;
  email: string;
  suggestedName: string | null;
  hasAccount: boolean;
}) {
  const router = useRouter();
  // After signing in, refresh so the header and server components see the new session.
  const go = (path: string) => {
    router.push(path);
    router.refresh();
  };
  const { pending, answer, onSubmit, fieldError } = useActionForm(
    (data) => acceptInvitationAction(data),
    async (result, form) => {
      const target = `/boards/${result.boardId}`;
      if (result.createdAccount) {
        const password = String(new FormData(form).get("password") ?? "");
        const signedIn = await signIn("password", { email: result.email, password, redirect: false, callbackUrl: target });
        if (signedIn?.ok && !signedIn.error) {
          go(target);
          return;
        }
      }
      go(result.createdAccount ? `/sign-in?callbackUrl=${encodeURIComponent(target)}` : target);
    },
  );
  return (
    <form onSubmit={onSubmit} className="space-y-4" aria-label="Accept the invitation">
      <input type="hidden" name="token" value={token} />
      <ActionNotice answer={answer} success="Accepted. Taking you to the board…" />
      <p className="text-sm text-ink-700">
        E-mail: <span className="font-semibold">{email}</span>
      </p>
      {hasAccount ? (
        <p className="text-ink-700">You are signed in with this address. Accepting adds the board to your account.</p>
      ) : (
        <>
          <TextField label="Your name" name="name" defaultValue={suggestedName ?? ""} autoComplete="name" required maxLength={120} error={fieldError("name")} />
          <TextField
            label="Choose a password"
            hint="At least 12 characters. A few unrelated words make a good one."
            name="password"
            type="password"
            autoComplete="new-password"
            minLength={12}
            required
            error={fieldError("password")}
          />
        </>
      )}
      <SubmitButton pending={pending}>{hasAccount ? "Add the board to my account" : "Create my account and join"}</SubmitButton>
    </form>
  );
}
