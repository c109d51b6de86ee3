"use client";
import { useState, useTransition } from "react";
import { useRouter } from "next/navigation";
import { FormNotice } from "@/components/ui/form-controls";
import { reassignReviewersAction } from "../actions";

export function ReassignButton({ boardId, proposalId, names, toVersion }: { boardId: string; proposalId: string; names: string[]; toVersion: number }) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [message, setMessage] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const run = () =>
    startTransition(async () => {
      const answer = await reassignReviewersAction({ boardId, proposalId });
      if (!answer.ok) {
        setMessage({ tone: "error", text: answer.error });
        return;
      }
      const { created, existing, skipped } = answer.data;
      setMessage({
        tone: "success",
        text: `${created} reviewer${created === 1 ? "" : "s"} asked to review version ${toVersion}${existing ? `; ${existing} already were` : ""}${skipped.length ? `; skipped (no longer reviewers): ${skipped.join(", ")}` : ""}.`,
      });
      router.refresh();
    });
  return (
    <div className="space-y-2">
      {names.length > 0 ? (
        <>
          <button
            type="button"
            onClick={run}
            disabled={pending}
            className="rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white disabled:opacity-50"
          >
            {pending ? "Assigning…" : `Ask the same reviewers to review version ${toVersion}`}
          </button>
          <p className="text-xs text-ink-500">{names.join(", ")} · due in two weeks · each gets an e-mail.</p>
        </>
      ) : (
        <p className="text-sm text-ink-700">Every reviewer still on the board is assigned to version {toVersion}.</p>
      )}
      {message ? <FormNotice tone={message.tone}>{message.text}</FormNotice> : null}
    </div>
  );
}
