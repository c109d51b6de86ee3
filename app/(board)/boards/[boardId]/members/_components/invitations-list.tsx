"use client";
import { useState, useTransition } from "react";
import { useRouter } from "next/navigation";
import { FormNotice } from "@/components/ui/form-controls";
import type { InvitationRow } from "@/lib/dal/invitations";
import { revokeInvitationAction } from "../actions";

const statusStyle = {
  pending: "bg-trajectory-100 text-trajectory-700",
  accepted: "bg-holds-100 text-holds-700",
  revoked: "bg-ink-100 text-ink-600",
  expired: "bg-drift-100 text-drift-700",
} as const;

export function InvitationsList({ boardId, invitations, empty }: { boardId: string; invitations: InvitationRow[]; empty: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  if (invitations.length === 0) return <p className="text-ink-600">{empty}</p>;
  return (
    <div className="space-y-3">
      {error ? <FormNotice tone="error">{error}</FormNotice> : null}
      <ul className="divide-y divide-ink-100">
        {invitations.map((invitation) => (
          <li key={invitation.id} className="flex flex-wrap items-center justify-between gap-2 py-2 text-sm">
            <span>
              <span className="font-semibold">{invitation.email}</span>
              {invitation.name ? <span className="text-ink-600"> ({invitation.name})</span> : null} as {invitation.role}
            </span>
            <span className="flex items-center gap-2">
              <span className={`rounded-chip px-2 py-0.5 text-xs font-semibold ${statusStyle[invitation.status]}`}>{invitation.status}</span>
              {invitation.status === "pending" ? (
                <button
                  type="button"
                  disabled={pending}
                  className="text-sm text-void-700 underline"
                  onClick={() =>
                    startTransition(async () => {
                      const result = await revokeInvitationAction({ boardId, invitationId: invitation.id });
                      if (result.ok) {
                        setError(null);
                        router.refresh();
                      } else setError(result.error);
                    })
                  }
                >
                  Withdraw<span className="sr-only"> the invitation of {invitation.email}</span>
                </button>
              ) : null}
            </span>
          </li>
        ))}
      </ul>
    </div>
  );
}
