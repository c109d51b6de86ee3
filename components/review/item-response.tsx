"use client";
// The response round on one review item: the proposer's answer (and the form to give it
// while the window is open), the current disposition with its history (who, when, why), and
// the form for the item's reviewer or the chair to record a disposition. Names come labelled
// by the server for this viewer (proposers see "Reviewer 1", never a name).
import { useId, useState } from "react";
import type { ReviewItemView } from "@/lib/dal/review-items";
import { formatDateTime } from "@/lib/format/dates";
import { ANSWER_MAX, DISPOSITION_CODES, DISPOSITION_HELP, DISPOSITION_LABELS, REASON_MAX, type DispositionCode } from "@/lib/review/responses";
import { CharacterCount } from "@/components/ui/form-controls";
import { callApi } from "./api";

/** Newer versions of the dossier and their section headings, which an answer may point at. */
export interface AnswerSectionOption {
  versionId: string;
  versionNumber: number;
  headings: string[];
}

const DISPOSITION_TONE: Record<DispositionCode, string> = {
  agreed: "bg-holds-100 text-holds-700",
  "fix-next-version": "bg-drift-100 text-drift-700",
  "not-accepted": "bg-void-100 text-void-700",
  closed: "bg-ink-100 text-ink-700",
};

export function DispositionChip({ code, label }: { code: DispositionCode; label: string }) {
  return <span className={`rounded-chip px-2 py-0.5 text-xs font-semibold ${DISPOSITION_TONE[code]}`}>{label}</span>;
}

export function ItemResponse({
  boardId,
  item,
  onChange,
  sections = [],
}: {
  boardId: string;
  item: ReviewItemView;
  onChange: (item: ReviewItemView) => void;
  sections?: AnswerSectionOption[];
}) {
  const hasAnything = item.answer || item.dispositionHistory.length > 0 || item.canAnswer || item.canDispose;
  if (!hasAnything) return null;
  return (
    <div className="mt-3 space-y-2 border-t border-ink-100 pt-2" data-item-response="">
      <AnswerBlock boardId={boardId} item={item} onChange={onChange} sections={sections} />
      <DispositionBlock boardId={boardId} item={item} onChange={onChange} />
    </div>
  );
}

function AnswerBlock({
  boardId,
  item,
  onChange,
  sections,
}: {
  boardId: string;
  item: ReviewItemView;
  onChange: (i: ReviewItemView) => void;
  sections: AnswerSectionOption[];
}) {
  const id = useId();
  const [editing, setEditing] = useState(false);
  const [body, setBody] = useState(item.answer?.body ?? "");
  const [section, setSection] = useState(item.answer?.section ? `${item.answer.section.versionId}|${item.answer.section.heading}` : "");
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const [saved, setSaved] = useState(false);
  const showForm = item.canAnswer && (editing || !item.answer);
  return (
    <div>
      {item.answer && !showForm ? (
        <div data-answer="">
          <p className="text-xs font-semibold uppercase tracking-wide text-ink-500">Answer</p>
          <p className="whitespace-pre-wrap text-sm">{item.answer.body}</p>
          {item.answer.section ? (
            <p className="text-xs text-ink-600">
              Points at “{item.answer.section.heading}” in version {item.answer.section.versionNumber}
            </p>
          ) : null}
          <p className="text-xs text-ink-500">
            {item.answer.authorLabel} · {formatDateTime(item.answer.updatedAt)}
          </p>
          {item.canAnswer ? (
            <button type="button" className="mt-1 text-sm font-semibold text-trajectory-700 underline" onClick={() => setEditing(true)}>
              Change the answer
            </button>
          ) : null}
          {saved ? (
            <p role="status" className="text-xs text-holds-700">
              Answer saved.
            </p>
          ) : null}
        </div>
      ) : null}
      {showForm ? (
        <form
          className="space-y-2"
          aria-label={`Answer to ${item.title}`}
          onSubmit={async (e) => {
            e.preventDefault();
            setPending(true);
            const [versionId, ...heading] = section ? section.split("|") : [];
            const answer = await callApi<{ item: ReviewItemView }>(`/api/v1/boards/${boardId}/review-items/${item.id}/answer`, {
              method: "PUT",
              body: { body, sectionVersionId: versionId ?? null, sectionHeading: heading.length ? heading.join("|") : null },
            });
            setPending(false);
            if (answer.ok) {
              onChange(answer.data.item);
              setError(null);
              setEditing(false);
              setSaved(true);
            } else setError(answer.error);
          }}
        >
          <label htmlFor={`${id}-answer`} className="block text-sm font-semibold text-ink-800">
            Your answer to “{item.title}”
          </label>
          <textarea
            id={`${id}-answer`}
            value={body}
            onChange={(e) => setBody(e.target.value)}
            required
            maxLength={ANSWER_MAX}
            rows={3}
            aria-describedby={`${id}-count`}
            className="w-full rounded-chip border border-ink-300 px-2 py-1 text-sm"
          />
          <CharacterCount id={`${id}-count`} length={body.length} max={ANSWER_MAX} />
          {sections.length > 0 ? (
            <div>
              <label htmlFor={`${id}-section`} className="block text-sm font-semibold text-ink-800">
                Section of a newer version (optional)
              </label>
              <select
                id={`${id}-section`}
                value={section}
                onChange={(e) => setSection(e.target.value)}
                className="mt-1 w-full rounded-chip border border-ink-300 bg-white px-2 py-1 text-sm"
              >
                <option value="">No section</option>
                {sections
                  .filter((s) => s.versionNumber > item.versionNumber)
                  .map((s) => (
                    <optgroup key={s.versionId} label={`Version ${s.versionNumber}`}>
                      {s.headings.map((h) => (
                        <option key={h} value={`${s.versionId}|${h}`}>
                          {h}
                        </option>
                      ))}
                    </optgroup>
                  ))}
              </select>
            </div>
          ) : null}
          <div className="flex gap-2">
            <button
              type="submit"
              disabled={pending}
              aria-busy={pending}
              className="rounded-chip bg-trajectory-600 px-3 py-1 text-sm font-semibold text-white hover:bg-trajectory-700 disabled:opacity-60"
            >
              {pending ? "Saving…" : "Save the answer"}
            </button>
            {item.answer ? (
              <button type="button" className="rounded-chip border border-ink-300 px-3 py-1 text-sm" onClick={() => setEditing(false)}>
                Keep the saved answer
              </button>
            ) : null}
          </div>
          {error ? (
            <p role="alert" className="text-sm text-void-700">
              {error}
            </p>
          ) : null}
        </form>
      ) : null}
    </div>
  );
}

function DispositionBlock({ boardId, item, onChange }: { boardId: string; item: ReviewItemView; onChange: (i: ReviewItemView) => void }) {
  const id = useId();
  const [code, setCode] = useState<DispositionCode | "">("");
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const history = item.dispositionHistory;
  return (
    <div>
      {item.disposition ? (
        <p className="flex flex-wrap items-center gap-2 text-sm" data-disposition={item.disposition.disposition}>
          <span className="text-xs font-semibold uppercase tracking-wide text-ink-500">Disposition</span>
          <DispositionChip code={item.disposition.disposition} label={item.disposition.label} />
          <span className="text-xs text-ink-500">
            {item.disposition.actorLabel} · {formatDateTime(item.disposition.createdAt)}
          </span>
        </p>
      ) : null}
      {history.length > 0 ? (
        <details className="mt-1 text-sm">
          <summary className="cursor-pointer text-trajectory-700">History of dispositions ({history.length})</summary>
          <ol className="mt-1 space-y-1 border-l-2 border-ink-100 pl-3" aria-label={`History of dispositions of ${item.title}`}>
            {history.map((d) => (
              <li key={d.id} data-disposition-entry="">
                <span className="font-semibold">{d.label}</span> · {d.actorLabel} ({d.actorRole === "chair" ? "chair" : "reviewer"}) ·{" "}
                {formatDateTime(d.createdAt)}
                {d.reason ? <span className="block whitespace-pre-wrap text-ink-700">Why: {d.reason}</span> : null}
              </li>
            ))}
          </ol>
        </details>
      ) : null}
      {item.canDispose ? (
        <form
          className="mt-2 space-y-2"
          aria-label={`Disposition of ${item.title}`}
          onSubmit={async (e) => {
            e.preventDefault();
            if (!code) {
              setError("Choose a disposition.");
              return;
            }
            setPending(true);
            const answer = await callApi<{ item: ReviewItemView }>(`/api/v1/boards/${boardId}/review-items/${item.id}/dispositions`, {
              method: "POST",
              body: { disposition: code, reason },
            });
            setPending(false);
            if (answer.ok) {
              onChange(answer.data.item);
              setCode("");
              setReason("");
              setError(null);
            } else setError(answer.error);
          }}
        >
          <fieldset>
            <legend className="text-sm font-semibold text-ink-800">Record a disposition</legend>
            <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
              {DISPOSITION_CODES.map((c) => (
                <label key={c} className="flex items-center gap-1 text-sm" title={DISPOSITION_HELP[c]}>
                  <input type="radio" name={`${id}-disposition`} value={c} checked={code === c} onChange={() => setCode(c)} className="accent-trajectory-600" />
                  {DISPOSITION_LABELS[c]}
                </label>
              ))}
            </div>
          </fieldset>
          <div>
            <label htmlFor={`${id}-reason`} className="block text-sm font-semibold text-ink-800">
              Why {code === "not-accepted" ? "(required)" : "(optional)"}
            </label>
            <textarea
              id={`${id}-reason`}
              value={reason}
              onChange={(e) => setReason(e.target.value)}
              required={code === "not-accepted"}
              maxLength={REASON_MAX}
              rows={2}
              aria-describedby={`${id}-reason-count`}
              className="w-full rounded-chip border border-ink-300 px-2 py-1 text-sm"
            />
            <CharacterCount id={`${id}-reason-count`} length={reason.length} max={REASON_MAX} />
          </div>
          <button
            type="submit"
            disabled={pending}
            aria-busy={pending}
            className="rounded-chip border border-ink-300 px-3 py-1 text-sm font-semibold hover:border-trajectory-500 disabled:opacity-60"
          >
            {pending ? "Saving…" : "Record the disposition"}
          </button>
          {error ? (
            <p role="alert" className="text-sm text-void-700">
              {error}
            </p>
          ) : null}
        </form>
      ) : null}
    </div>
  );
}
