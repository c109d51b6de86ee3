"use client";
import { useRouter } from "next/navigation";
import { ActionNotice, SubmitButton, useActionForm } from "@/components/ui/form-controls";
import { revokeOtherSessionsAction } from "../actions";

export function SignOutOthers({ otherSessions }: { otherSessions: number }) {
  const router = useRouter();
  const { pending, answer, onSubmit } = useActionForm(revokeOtherSessionsAction, () => router.refresh());
  return (
    <form onSubmit={onSubmit} className="space-y-3" aria-label="Sign out of other browsers">
      <p className="text-ink-700">
        {otherSessions === 0
          ? "No other browser is signed in to your account."
          : `${otherSessions} other browser${otherSessions === 1 ? " is" : "s are"} signed in to your account.`}
      </p>
      <ActionNotice
        answer={answer}
        success={answer?.ok ? `Signed out of ${answer.data.revoked} other browser${answer.data.revoked === 1 ? "" : "s"}.` : undefined}
      />
      <SubmitButton pending={pending} tone="quiet">
        Sign out everywhere else
      </SubmitButton>
    </form>
  );
}
