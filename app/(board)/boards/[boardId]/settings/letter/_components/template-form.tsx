"use client";
import { useState, useTransition } from "react";
import { useRouter } from "next/navigation";
import { FormNotice } from "@/components/ui/form-controls";
import { LetterEditor, useLetterEditor, type MergeFieldChoice } from "../../../proposals/[proposalId]/decision/_components/letter-editor";
import { saveLetterTemplateAction } from "../actions";

export function TemplateForm({
  boardId,
  template,
  fields,
  isDefault,
}: {
  boardId: string;
  template: Record<string, unknown>;
  fields: readonly MergeFieldChoice[];
  isDefault: boolean;
}) {
  const router = useRouter();
  const editor = useLetterEditor(template);

  const [pending, startTransition] = useTransition();
  const [message, setMessage] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const save = (reset: boolean) =>
    startTransition(async () => {
      const answer = await saveLetterTemplateAction({ boardId, template: reset ? null : (editor?.getJSON() ?? template) });
      if (!answer.ok) return setMessage({ tone: "error", text: answer.error });
      setMessage({ tone: "success", text: reset ? "Back to VisViva's default letter." : "Saved. New decisions start from this letter." });
      // The editor holds its own copy of the text: show the default letter after a reset.
      if (reset) window.location.reload();
      else router.refresh();
    });
  return (
    <div className="space-y-4">
      <LetterEditor editor={editor} fields={fields} />
      {message ? <FormNotice tone={message.tone}>{message.text}</FormNotice> : null}
      <div className="flex flex-wrap gap-3">
        <button
          type="button"
          onClick={() => save(false)}
          disabled={pending}
          className="rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white disabled:opacity-50"
        >
          Save the template
        </button>
        {!isDefault ? (
          <button
            type="button"
            onClick={() => save(true)}
            disabled={pending}
            className="rounded-chip border border-ink-300 px-4 py-2 text-ink-800 disabled:opacity-50"
          >
            Use the default letter
          </button>
        ) : null}
      </div>
    </div>
  );
}
