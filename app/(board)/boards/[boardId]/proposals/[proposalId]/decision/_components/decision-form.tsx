"use client";
import { useEffect, useRef, useState, useTransition } from "react";
import { useRouter } from "next/navigation";
import { FormNotice } from "@/components/ui/form-controls";
import { issueDecisionAction, previewDecisionAction } from "../actions";
import { LetterEditor, useLetterEditor, type MergeFieldChoice } from "./letter-editor";

type Outcome = "accept" | "revise" | "decline";
const choices: { value: Outcome; label: string; hint: string }[] = [
  { value: "accept", label: "Accept", hint: "The proposal goes ahead as submitted." },
  { value: "revise", label: "Revise and resubmit", hint: "The authors revise this version and submit the next one." },
  { value: "decline", label: "Decline", hint: "The round ends for this proposal." },
];

interface Props {
  boardId: string;
  proposalId: string;
  template: Record<string, unknown>;
  fields: readonly MergeFieldChoice[];
  items: { id: string; severity: string; title: string; status: string }[];
  needsOverride: boolean;
  reviewsNote: string;
}

export function DecisionForm({ boardId, proposalId, template, fields, items, needsOverride, reviewsNote }: Props) {
  const router = useRouter();
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const [selected, setSelected] = useState<string[]>(items.filter((i) => i.status === "open" && i.severity === "major").map((i) => i.id));
  const [overrideReason, setOverrideReason] = useState("");
  const [attachReport, setAttachReport] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [preview, setPreview] = useState<{ subject: string; letterHtml: string } | null>(null);
  // "Send the decision" first shows the letter as it will go out, then asks to confirm.
  const [confirming, setConfirming] = useState(false);
  const [pending, startTransition] = useTransition();
  const previewHeading = useRef<HTMLHeadingElement>(null);
  const editor = useLetterEditor(template, () => {
    setPreview(null);
    setConfirming(false);
  });
  useEffect(() => {
    if (preview) previewHeading.current?.focus();
  }, [preview, confirming]);

  const payload = () => ({
    boardId,
    proposalId,
    outcome: outcome ?? "revise",
    letter: (editor?.getJSON() ?? template) as Record<string, unknown>,
    selectedReviewItemIds: selected,
    overrideReason: overrideReason.trim() || undefined,
    attachReport,
  });

  const runPreview = (thenConfirm = false) =>
    startTransition(async () => {
      setError(null);
      if (thenConfirm && !outcome) {
        setError("Choose the outcome first.");
        return;
      }
      const answer = await previewDecisionAction(payload());
      if (answer.ok) {
        setPreview({ subject: answer.data.subject, letterHtml: answer.data.letterHtml });
        setConfirming(thenConfirm);
      } else {
        setPreview(null);
        setConfirming(false);
        setError(answer.error);
      }
    });

  const send = () =>
    startTransition(async () => {
      setError(null);
      if (!outcome) {
        setError("Choose the outcome first.");
        return;
      }
      const answer = await issueDecisionAction(payload());
      if (answer.ok) router.refresh();
      else setError(answer.error);
    });

  return (
    <div className="space-y-5">
      <fieldset>
        <legend className="text-sm font-semibold text-ink-800">Outcome</legend>
        <div className="mt-2 grid gap-2 sm:grid-cols-3">
          {choices.map((c) => (
            <label
              key={c.value}
              className={`cursor-pointer rounded-panel border p-3 ${outcome === c.value ? "border-trajectory-500 bg-trajectory-100" : "border-ink-200 bg-white"}`}
            >
              <input
                type="radio"
                name="outcome"
                value={c.value}
                checked={outcome === c.value}
                onChange={() => {
                  setOutcome(c.value);
                  setPreview(null);
                  setConfirming(false);
                }}
                className="mr-2"
              />
              <span className="font-semibold text-ink-900">{c.label}</span>
              <span className="mt-1 block text-xs text-ink-600">{c.hint}</span>
            </label>
          ))}
        </div>
      </fieldset>

      {items.length > 0 ? (
        <fieldset>
          <legend className="text-sm font-semibold text-ink-800">Review items to list in the letter</legend>
          <p className="text-xs text-ink-500">
            They replace <code className="font-mono">{"{{reviewItems.selected}}"}</code>.
          </p>
          <ul className="mt-2 space-y-1">
            {items.map((i) => (
              <li key={i.id}>
                <label className="flex items-start gap-2 text-sm">
                  <input
                    type="checkbox"
                    checked={selected.includes(i.id)}
                    onChange={(e) => setSelected((s) => (e.target.checked ? [...s, i.id] : s.filter((x) => x !== i.id)))}
                    className="mt-1"
                  />
                  <span>
                    <span className="font-mono text-xs uppercase text-ink-500">{i.severity}</span> {i.title}
                    {i.status === "resolved" ? <span className="ml-1 text-xs text-holds-700">(resolved)</span> : null}
                  </span>
                </label>
              </li>
            ))}
          </ul>
        </fieldset>
      ) : null}

      {needsOverride ? (
        <div className="rounded-panel border border-drift-500/40 bg-drift-100 p-3">
          <label htmlFor="override-reason" className="block text-sm font-semibold text-drift-700">
            Reason for deciding without the required reviews
          </label>
          <p className="text-xs text-drift-700">{reviewsNote} The reason is kept with the decision and in the audit log.</p>
          <textarea
            id="override-reason"
            value={overrideReason}
            onChange={(e) => setOverrideReason(e.target.value)}
            rows={2}
            className="mt-1 block w-full rounded-chip border border-ink-300 bg-white px-3 py-2"
          />
        </div>
      ) : null}

      <div>
        <h3 className="mb-2 text-sm font-semibold text-ink-800">Letter</h3>
        <LetterEditor editor={editor} fields={fields} />
      </div>

      <label className="flex items-start gap-2 text-sm">
        <input type="checkbox" checked={attachReport} onChange={(e) => setAttachReport(e.target.checked)} className="mt-1" />
        <span>
          <span className="font-semibold text-ink-900">Attach the review report (PDF) to the letter e-mail</span>
          <span className="block text-xs text-ink-600">
            Scores, review items, orbit checks and changes since the previous version, with reviewers numbered, not named.
          </span>
        </span>
      </label>

      {error ? <FormNotice tone="error">{error}</FormNotice> : null}

      <div className="flex flex-wrap gap-3">
        <button
          type="button"
          onClick={() => runPreview(false)}
          disabled={pending}
          className="rounded-chip border border-ink-300 bg-white px-4 py-2 font-semibold text-ink-800 disabled:opacity-50"
        >
          Preview the letter
        </button>
        <button
          type="button"
          onClick={() => runPreview(true)}
          disabled={pending || !outcome}
          className="rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white disabled:opacity-50"
        >
          {pending ? "Working…" : "Send the decision…"}
        </button>
      </div>
      {!outcome ? <p className="text-xs text-ink-600">Choose the outcome above to send the decision.</p> : null}

      {preview ? (
        <section aria-labelledby="letter-preview-heading" className="rounded-panel border border-trajectory-400 bg-paper p-5">
          <h3 id="letter-preview-heading" ref={previewHeading} tabIndex={-1} className="mb-2 text-sm font-semibold text-ink-800 focus:outline-none">
            {confirming ? "Check the letter, then confirm" : "Letter preview"}
          </h3>
          <p className="text-xs uppercase tracking-widest text-ink-500">Subject</p>
          <p className="mb-3 font-semibold text-ink-900">{preview.subject}</p>
          <div className="prose-dossier" dangerouslySetInnerHTML={{ __html: preview.letterHtml }} />
          {confirming ? (
            <div className="mt-4 space-y-2 border-t border-ink-200 pt-3">
              <p className="text-sm text-ink-800">
                Sending records the decision ({choices.find((c) => c.value === outcome)?.label.toLowerCase()}) for good and e-mails this letter, with its PDF,
                to the proposal&apos;s authors{attachReport ? ", with the review report attached" : ""}. It cannot be undone.
              </p>
              <div className="flex flex-wrap gap-3">
                <button
                  type="button"
                  onClick={send}
                  disabled={pending}
                  className="rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white disabled:opacity-50"
                >
                  {pending ? "Sending…" : "Confirm and send the decision"}
                </button>
                <button
                  type="button"
                  onClick={() => setConfirming(false)}
                  disabled={pending}
                  className="rounded-chip border border-ink-300 bg-white px-4 py-2 font-semibold text-ink-800"
                >
                  Not yet: keep editing
                </button>
              </div>
            </div>
          ) : null}
        </section>
      ) : null}
    </div>
  );
}
