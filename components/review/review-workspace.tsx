"use client";
// The review screen: the submitted dossier (read-only, with the server's verdicts) beside the
// rubric as an editable table. Scores autosave with the review's revision; a stale save is
// refused by the server (409) and what the reviewer typed stays on screen.
import { formatDateTime } from "@/lib/format/dates";
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { createColumnHelper, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import { TableView } from "@/components/data-table/table-view";
import { VerdictBadge } from "@/components/dossier/verdict-badge";
import { ConsistentMeaning, FailingChecks } from "@/components/dossier/check-explain";
import { kindLabel } from "@/lib/orbit/labels";
import type { CheckRow, ReviewScreen, ReviewState } from "@/lib/dal/reviews";
import { RequirementFlags } from "@/components/dossier/requirement-flags";
import type { ReviewItemView } from "@/lib/dal/review-items";
import { changedKeys, keepBoth, mergeDrafts, type Draft, type Overlap } from "@/lib/review/draft-merge";
import { anchorForTypedQuote, makeAnchor, resolveAnchor, type Anchor } from "@/lib/review/anchors";
import { weightedTotal, type CriterionScore, type RubricCriterion } from "@/lib/review/rubric";
import { callApi, formatScore } from "./api";
import { CONFIDENCE_LABELS, EXPERTISE_LABELS, REVIEWER_LEVELS, type ReviewerLevel } from "@/lib/review/responses";
import { domText, highlight, offsetOf } from "./dossier-text";
import { ReviewItemsPanel } from "./review-items-panel";

type SaveState = "idle" | "dirty" | "saving" | "saved" | "stale" | "locked" | "closed" | "error";

interface Props {
  boardId: string;
  screen: ReviewScreen;
  items: ReviewItemView[];
  /** The chair may raise items too; the assigned reviewer may while the review is a draft. */
  canRaise: boolean;
}

const saveText: Record<SaveState, string> = {
  idle: "No changes yet",
  dirty: "Unsaved changes…",
  saving: "Saving…",
  saved: "All changes saved",
  stale: "Not saved: changed elsewhere",
  locked: "Submitted and locked",
  closed: "Closed: the proposal is decided",
  error: "Not saved",
};

export function ReviewWorkspace({ boardId, screen, items: initialItems, canRaise }: Props) {
  const criteria = useMemo(() => screen.rubric?.criteria ?? [], [screen.rubric]);
  const base = `/api/v1/boards/${boardId}/reviews/${screen.assignment.id}`;
  const [review, setReview] = useState<ReviewState>(screen.review);
  const [scores, setScores] = useState<Record<string, CriterionScore>>(screen.review.scores);
  const [summary, setSummary] = useState(screen.review.summary);
  // Confidence and expertise save with the draft (sent only once chosen); they weigh nothing.
  const [levels, setLevels] = useState<Levels>({ confidence: screen.review.confidence ?? null, expertise: screen.review.expertise ?? null });
  const levelsRef = useRef(levels);
  const [canEdit, setCanEdit] = useState(screen.canEdit);
  const [saveState, setSaveState] = useState<SaveState>(screen.closedReason ? "closed" : screen.review.status === "submitted" ? "locked" : "idle");
  const [closedReason, setClosedReason] = useState(screen.closedReason);
  const [message, setMessage] = useState<string | null>(null);
  const [problems, setProblems] = useState<string[]>([]);
  const [stale, setStale] = useState<{ server: ReviewState; base: Draft; overlaps: Overlap[] } | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [raised, setRaised] = useState<ReviewItemView | null>(null);

  // After raising an item: bring it into view in the list and say so (the live region below).
  useEffect(() => {
    if (!raised) return;
    const li = document.querySelector<HTMLElement>(`li[data-item="${CSS.escape(raised.id)}"]`);
    if (!li) return;
    li.scrollIntoView({ block: "center" });
    if (!li.hasAttribute("tabindex")) li.setAttribute("tabindex", "-1");
    li.focus({ preventScroll: true });
  }, [raised]);
  const [items, setItems] = useState(initialItems);
  const [activeItem, setActiveItem] = useState<string | null>(null);

  const revision = useRef(screen.review.revision);
  const latest = useRef<Draft>({ scores, summary });
  // The saved state the edits on screen started from: the base of the three-way merge.
  const baseline = useRef<Draft>({ scores: screen.review.scores, summary: screen.review.summary });
  const saving = useRef(false);
  const again = useRef(false);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);

  useEffect(() => {
    latest.current = { scores, summary };
  }, [scores, summary]);

  const show = useCallback((draft: Draft) => {
    latest.current = draft;
    setScores(draft.scores);
    setSummary(draft.summary);
  }, []);

  const save = useCallback(async (): Promise<boolean> => {
    if (saving.current) {
      // A save is in flight: it goes round once more with the newest text when it returns.
      again.current = true;
      return false;
    }
    saving.current = true;
    setSaveState("saving");
    try {
      for (let merges = 0; ;) {
        again.current = false;
        const sent = latest.current;
        const chosen = levelsRef.current;
        const answer = await callApi<{ review: ReviewState }>(base, {
          method: "PUT",
          body: {
            revision: revision.current,
            ...sent,
            ...(chosen.confidence ? { confidence: chosen.confidence } : {}),
            ...(chosen.expertise ? { expertise: chosen.expertise } : {}),
          },
        });
        if (answer.ok) {
          revision.current = answer.data.review.revision;
          baseline.current = { scores: answer.data.review.scores, summary: answer.data.review.summary };
          setReview(answer.data.review);
          setMessage(null);
          setProblems([]);
          if (again.current || changedKeys(sent, latest.current).length > 0) continue;
          setSaveState("saved");
          return true;
        }
        const details = answer.details as { review?: ReviewState; issues?: { message: string }[]; closed?: boolean } | undefined;
        if (answer.status === 409 && details?.closed) {
          // The version was decided meanwhile: the review is closed; what is on screen stays visible.
          setCanEdit(false);
          setClosedReason(answer.error);
          setSaveState("closed");
          return false;
        }
        if (answer.status === 409 && details?.review?.status === "submitted") {
          setSaveState("locked");
          setCanEdit(false);
          setReview(details.review);
        } else if (answer.status === 409 && details?.review !== undefined) {
          // Saved elsewhere since this screen loaded (another tab, or a page restored by Back).
          // Merge: one-sided changes are kept from both; only true overlaps ask the reviewer.
          const server = details.review;
          const base = baseline.current;
          const { merged, overlaps } = mergeDrafts(base, latest.current, server);
          revision.current = server.revision;
          baseline.current = { scores: server.scores, summary: server.summary };
          setReview(server);
          if (overlaps.length === 0 && merges < 3) {
            merges++;
            show(merged);
            setNotice("A newer save of this review was found; your changes were added to it.");
            if (changedKeys(merged, baseline.current).length === 0) {
              setSaveState("saved");
              return true;
            }
            continue;
          }
          setStale({ server, base, overlaps });
          setSaveState("stale");
          setMessage(
            "This review was saved elsewhere (another tab or device) with different values in the fields listed below. Your text is still on screen and nothing has been overwritten; choose how to go on.",
          );
          setProblems([]);
          return false;
        } else setSaveState("error");
        setMessage(answer.error);
        setProblems(details?.issues?.map((i) => i.message) ?? []);
        return false;
      }
    } finally {
      saving.current = false;
    }
  }, [base, show]);

  // The page may be shown from a cache (Back/Forward, the router's cache or the browser's
  // back-forward cache): ask the server for the saved review whenever the screen appears.
  const refresh = useCallback(async () => {
    const answer = await callApi<ReviewScreen>(base);
    if (!answer.ok) return;
    const server = answer.data.review;
    if (answer.data.closedReason && !closedReason) {
      setClosedReason(answer.data.closedReason);
      setCanEdit(false);
      setSaveState("closed");
    }
    if (server.revision === revision.current && server.status === review.status) return;
    if (changedKeys(baseline.current, latest.current).length > 0 && answer.data.canEdit) {
      // Unsaved edits on screen: the save merges them with the newer saved state.
      void save();
      return;
    }
    revision.current = server.revision;
    baseline.current = { scores: server.scores, summary: server.summary };
    show(baseline.current);
    levelsRef.current = { confidence: server.confidence ?? null, expertise: server.expertise ?? null };
    setLevels(levelsRef.current);
    setReview(server);
    setCanEdit(answer.data.canEdit);
    setClosedReason(answer.data.closedReason);
    setStale(null);
    setMessage(null);
    setSaveState(answer.data.closedReason ? "closed" : server.status === "submitted" ? "locked" : "saved");
  }, [base, closedReason, review.status, save, show]);

  const refreshRef = useRef(refresh);
  useEffect(() => {
    refreshRef.current = refresh;
  }, [refresh]);
  useEffect(() => {
    void refreshRef.current();
    const onShow = (e: PageTransitionEvent) => {
      if (e.persisted) void refreshRef.current();
    };
    window.addEventListener("pageshow", onShow);
    return () => window.removeEventListener("pageshow", onShow);
  }, []);

  const schedule = useCallback(() => {
    setSaveState("dirty");
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void save(), 700);
  }, [save]);

  useEffect(() => () => void (timer.current && clearTimeout(timer.current)), []);

  const setScore = (id: string, patch: Partial<CriterionScore>) => {
    setScores((prev) => ({ ...prev, [id]: { score: prev[id]?.score ?? null, comment: prev[id]?.comment ?? "", ...patch } }));
    if (saveState !== "stale") schedule();
  };

  const submit = async () => {
    if (timer.current) clearTimeout(timer.current);
    if (saveState === "dirty" || saveState === "error") {
      if (!(await save())) return;
    }
    const answer = await callApi<{ review: ReviewState }>(`${base}/submit`, { method: "POST", body: { revision: revision.current } });
    if (answer.ok) {
      revision.current = answer.data.review.revision;
      setReview(answer.data.review);
      setCanEdit(false);
      setSaveState("locked");
      setMessage(null);
      setProblems([]);
    } else {
      setMessage(answer.error);
      setProblems(((answer.details as { issues?: { message: string }[] } | undefined)?.issues ?? []).map((i) => i.message));
    }
  };

  const total = weightedTotal(criteria, scores);

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,38rem)]">
      <DossierPane
        boardId={boardId}
        proposalId={screen.proposal.id}
        versionId={screen.version.id}
        html={screen.version.html}
        serverText={screen.version.plainText}
        items={items}
        activeItem={activeItem}
        onActivate={setActiveItem}
        canRaise={canRaise || canEdit}
        onRaised={(item) => {
          setItems((prev) => [...prev, item]);
          setRaised(item);
        }}
      />
      <div className="space-y-6">
        <p role="status" aria-live="polite" className="sr-only" data-testid="raised-announcement">
          {raised ? `Review item “${raised.title}” raised; it is listed under the review items.` : ""}
        </p>
        <section aria-labelledby="rubric-heading" className="rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
          <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
            <h2 id="rubric-heading" className="text-lg font-semibold">
              Rubric{screen.rubric ? ` · ${screen.rubric.name} (v${screen.rubric.version})` : ""}
            </h2>
            <p role="status" aria-live="polite" data-save-state={saveState} className="text-sm text-ink-600">
              {saveText[saveState]}
              {review.updatedAt && saveState === "saved" ? ` · ${formatDateTime(review.updatedAt)}` : ""}
            </p>
          </div>
          {closedReason ? (
            <p data-testid="review-closed" className="mb-3 rounded-chip border border-ink-300 bg-ink-50 px-3 py-2 text-sm text-ink-800">
              {closedReason}
            </p>
          ) : null}
          {!screen.rubric ? (
            <p className="text-ink-600">The chair has not set up the rubric for this call yet.</p>
          ) : (
            <RubricTable criteria={criteria} scores={scores} editable={canEdit} onChange={setScore} />
          )}
          <div className="mt-4 flex items-baseline justify-between rounded-chip bg-ink-50 px-3 py-2">
            <span className="font-semibold">Weighted total</span>
            <span data-testid="weighted-total" className="font-mono text-lg">
              {formatScore(total.value)}
              {criteria[0] ? <span className="text-sm text-ink-600"> / {criteria[0].scaleMax}</span> : null}
              <span className="ml-2 text-sm text-ink-600">
                ({total.scored} of {total.total} scored)
              </span>
            </span>
          </div>
          <label className="mt-4 block text-sm font-semibold text-ink-800">
            Summary for the chair
            <textarea
              value={summary}
              disabled={!canEdit}
              onChange={(e) => {
                setSummary(e.target.value);
                if (saveState !== "stale") schedule();
              }}
              rows={4}
              maxLength={20000}
              className="mt-1 block w-full rounded-chip border border-ink-300 bg-white px-3 py-2 font-normal disabled:bg-ink-50"
            />
          </label>
          <ReviewerLevels
            levels={levels}
            disabled={!canEdit}
            onChange={(next) => {
              levelsRef.current = next;
              setLevels(next);
              if (saveState !== "stale") schedule();
            }}
          />
          {message ? (
            <div role="alert" className="mt-3 rounded-chip border border-void-500/50 bg-void-100 px-3 py-2 text-sm text-void-700">
              <p>{message}</p>
              {problems.length > 1 ? (
                <ul className="mt-1 list-disc pl-5">
                  {problems.map((p) => (
                    <li key={p}>{p}</li>
                  ))}
                </ul>
              ) : null}
            </div>
          ) : null}
          {notice && !message ? (
            <p role="status" className="mt-3 rounded-chip border border-trajectory-400/60 bg-trajectory-100/40 px-3 py-2 text-sm">
              {notice}
            </p>
          ) : null}
          {stale ? (
            <div data-testid="save-conflict" className="mt-3 space-y-2">
              <ul className="space-y-2 text-sm">
                {stale.overlaps.map((o) => (
                  <li key={o.key} className="rounded-chip border border-ink-200 p-2">
                    <p className="font-semibold">{fieldLabel(o.key, criteria)}</p>
                    <p>
                      Saved: <span className="whitespace-pre-wrap">{o.theirs === null || o.theirs === "" ? "(empty)" : String(o.theirs)}</span>
                    </p>
                    <p>
                      Yours: <span className="whitespace-pre-wrap">{o.mine === null || o.mine === "" ? "(empty)" : String(o.mine)}</span>
                    </p>
                  </li>
                ))}
              </ul>
              <div className="flex flex-wrap gap-2">
                <button
                  type="button"
                  className="rounded-chip bg-trajectory-600 px-3 py-1.5 text-sm font-semibold text-white hover:bg-trajectory-700"
                  onClick={() => {
                    const serverDraft = { scores: stale.server.scores, summary: stale.server.summary };
                    const { merged, overlaps } = mergeDrafts(stale.base, latest.current, serverDraft);
                    show(keepBoth(merged, overlaps));
                    setStale(null);
                    setMessage(null);
                    setNotice("Kept both: your text first, then the saved text under “— saved elsewhere —”; your scores are used. Edit as you like.");
                    void save();
                  }}
                >
                  Keep both texts and save
                </button>
                <button
                  type="button"
                  className="rounded-chip border border-ink-300 px-3 py-1.5 text-sm font-semibold hover:border-trajectory-500"
                  onClick={() => {
                    const serverDraft = { scores: stale.server.scores, summary: stale.server.summary };
                    const { merged } = mergeDrafts(stale.base, latest.current, serverDraft);
                    show(merged);
                    setStale(null);
                    setMessage(null);
                    setNotice(null);
                    const pending = changedKeys(merged, baseline.current).length > 0;
                    setSaveState(pending ? "dirty" : "saved");
                    if (pending) void save();
                  }}
                >
                  Use the saved text
                </button>
              </div>
            </div>
          ) : null}
          <div className="mt-4 flex flex-wrap items-center gap-3">
            {canEdit ? (
              <button
                type="button"
                onClick={() => void submit()}
                className="rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white hover:bg-trajectory-700"
              >
                Submit review
              </button>
            ) : null}
            <span className="text-sm text-ink-600">
              Status: <strong data-testid="review-status">{review.status}</strong>
              {review.submittedAt ? ` · submitted ${formatDateTime(review.submittedAt)}` : ""}
            </span>
          </div>
          {screen.canReopen && review.status === "submitted" ? <ReopenForm base={base} onReopened={(r) => setReview(r)} /> : null}
        </section>
        <ChecksPanel base={base} checks={screen.checks} editable={canEdit} onRevision={(r) => (revision.current = Math.max(revision.current, r))} />
        <ReviewItemsPanel
          boardId={boardId}
          items={items}
          activeItem={activeItem}
          onActivate={setActiveItem}
          onChange={(item) => setItems((prev) => prev.map((i) => (i.id === item.id ? item : i)))}
        />
      </div>
    </div>
  );
}

function fieldLabel(key: string, criteria: RubricCriterion[]): string {
  if (key === "summary") return "Summary for the chair";
  const id = key.slice(key.indexOf(":") + 1);
  const title = criteria.find((c) => c.id === id)?.title ?? id;
  return key.startsWith("score:") ? `Score for ${title}` : `Comment on ${title}`;
}

const column = createColumnHelper<RubricCriterion>();

/** What the rubric cells read on each render: the table's meta, so the columns stay the same objects. */
interface RubricMeta {
  scores: Record<string, CriterionScore>;
  editable: boolean;
  onChange: (id: string, patch: Partial<CriterionScore>) => void;
}
const rubricMeta = (meta: unknown) => meta as RubricMeta;

// The columns are defined once, outside any component. TanStack's flexRender renders a cell
// function as a React component, so a column list rebuilt on every render gave each cell a
// new component type: React unmounted and remounted the comment box and the score buttons
// after every keystroke or arrow key, which kept one character and dropped focus.
const rubricColumns = [
  column.display({
    id: "criterion",
    header: "Criterion",
    cell: ({ row }) => (
      <div>
        <p className="font-semibold">{row.original.title}</p>
        <p className="text-xs text-ink-500">Weight {row.original.weight} %</p>
        {row.original.description ? <p className="mt-1 text-xs text-ink-600">{row.original.description}</p> : null}
      </div>
    ),
  }),
  column.display({
    id: "score",
    header: "Score",
    cell: ({ row, table }) => {
      const { scores, editable, onChange } = rubricMeta(table.options.meta);
      const c = row.original;
      const current = scores[c.id]?.score ?? null;
      const levels = Array.from({ length: c.scaleMax - c.scaleMin + 1 }, (_, i) => c.scaleMin + i);
      return (
        <fieldset>
          <legend className="sr-only">Score for {c.title}</legend>
          <div className={`flex gap-1 ${levels.length > 6 ? "flex-wrap" : "flex-nowrap"}`}>
            {levels.map((level) => (
              <label
                key={level}
                title={c.levels[level - c.scaleMin]}
                data-selected={current === level || undefined}
                className={`cursor-pointer rounded-chip border px-2 py-1 font-mono text-sm has-[:checked]:border-2 has-[:checked]:border-trajectory-700 has-[:checked]:bg-trajectory-100 has-[:checked]:font-bold has-[:checked]:before:mr-0.5 has-[:checked]:before:content-['✓'] has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-trajectory-600 ${editable ? "" : "cursor-default opacity-80"}`}
              >
                <input
                  type="radio"
                  className="sr-only"
                  name={`score-${c.id}`}
                  value={level}
                  checked={current === level}
                  disabled={!editable}
                  aria-label={`${c.title}: ${level} – ${c.levels[level - c.scaleMin] ?? ""}`}
                  onChange={() => onChange(c.id, { score: level })}
                />
                {level}
              </label>
            ))}
          </div>
          <p className="mt-1 text-xs text-ink-600">{current !== null ? `Selected ${current}: ${c.levels[current - c.scaleMin] ?? ""}` : "Not scored"}</p>
        </fieldset>
      );
    },
  }),
  column.display({
    id: "comment",
    header: "Comment",
    cell: ({ row, table }) => {
      const { scores, editable, onChange } = rubricMeta(table.options.meta);
      const c = row.original;
      const entry = scores[c.id];
      const required = c.commentRequiredBelow !== null && entry?.score !== null && entry?.score !== undefined && entry.score < c.commentRequiredBelow;
      const missing = required && !(entry?.comment ?? "").trim();
      return (
        <div>
          <textarea
            aria-label={`Comment on ${c.title}`}
            aria-invalid={missing || undefined}
            value={entry?.comment ?? ""}
            disabled={!editable}
            rows={2}
            maxLength={8000}
            onChange={(e) => onChange(c.id, { comment: e.target.value })}
            className="block w-full min-w-40 rounded-chip border border-ink-300 px-2 py-1 text-sm aria-[invalid=true]:border-void-500 disabled:bg-ink-50"
          />
          {c.commentRequiredBelow !== null ? (
            <p className={`text-xs ${missing ? "text-void-700" : "text-ink-500"}`}>Required below {c.commentRequiredBelow}</p>
          ) : null}
        </div>
      );
    },
  }),
  column.display({
    id: "points",
    header: () => <span title="weight × score / 100">Points</span>,
    cell: ({ row, table }) => {
      const s = rubricMeta(table.options.meta).scores[row.original.id]?.score;
      return <span className="font-mono">{s === null || s === undefined ? "–" : ((row.original.weight * s) / 100).toFixed(2)}</span>;
    },
  }),
];

function RubricTable({ criteria, scores, editable, onChange }: RubricMeta & { criteria: RubricCriterion[] }) {
  const meta: RubricMeta = { scores, editable, onChange };
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({ data: criteria, columns: rubricColumns, meta, getRowId: (c) => c.id, getCoreRowModel: getCoreRowModel() });
  return (
    <div className="overflow-x-auto">
      <TableView table={table} caption="Rubric criteria with your scores and comments" dense rowData={(row) => ({ "data-criterion": row.id })} />
    </div>
  );
}

function ReopenForm({ base, onReopened }: { base: string; onReopened: (r: ReviewState) => void }) {
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  return (
    <form
      className="mt-4 space-y-2 border-t border-ink-100 pt-3"
      onSubmit={async (e) => {
        e.preventDefault();
        const answer = await callApi<{ review: ReviewState }>(`${base}/reopen`, { method: "POST", body: { reason } });
        if (answer.ok) {
          onReopened(answer.data.review);
          setError(null);
          window.location.reload();
        } else setError(answer.error);
      }}
    >
      <label className="block text-sm font-semibold">
        Reopen this review (recorded in the audit log)
        <input
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          required
          minLength={3}
          placeholder="Why it is reopened"
          className="mt-1 block w-full rounded-chip border border-ink-300 px-3 py-1.5 font-normal"
        />
      </label>
      {error ? (
        <p role="alert" className="text-sm text-void-700">
          {error}
        </p>
      ) : null}
      <button type="submit" className="rounded-chip border border-ink-300 px-3 py-1.5 text-sm font-semibold hover:border-trajectory-500">
        Reopen
      </button>
    </form>
  );
}

function ChecksPanel({ base, checks, editable, onRevision }: { base: string; checks: CheckRow[]; editable: boolean; onRevision: (r: number) => void }) {
  const [notes, setNotes] = useState<Record<string, string>>(Object.fromEntries(checks.map((c) => [c.id, c.note])));
  const [state, setState] = useState<Record<string, string>>({});
  if (checks.length === 0) return null;
  const flagged = checks.filter((c) => c.status !== "consistent").length;
  const unmet = checks.filter((c) => (c.verdict.requirements ?? []).some((o) => o.status === "notMet")).length;
  return (
    <section aria-labelledby="checks-heading" className="rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
      <h2 id="checks-heading" className="text-lg font-semibold">
        Orbit checks recomputed by the server
      </h2>
      <p className="mb-3 text-sm text-ink-600">
        {checks.length} blocks, {flagged} flagged{unmet > 0 ? `, ${unmet} with a requirement not met` : ""}. Two-body screening estimates, not a substitute for
        high-fidelity analysis.
      </p>
      <ConsistentMeaning tolerance={checks.find((c) => c.tolerance)?.tolerance ?? undefined} className="mb-3 text-xs text-ink-600" />
      <ul className="space-y-3">
        {checks.map((c) => (
          <li key={c.id} data-check-block={c.blockId} className="rounded-chip border border-ink-100 p-3">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <a
                href={`#check-${c.blockId}`}
                onClick={() => document.querySelector(`[data-block-id="${CSS.escape(c.blockId)}"]`)?.scrollIntoView({ behavior: "smooth", block: "center" })}
                className="font-semibold text-trajectory-700 hover:underline"
              >
                {c.label || kindLabel(c.kind)}
              </a>
              <VerdictBadge status={c.status} prefix="Server:" />
            </div>
            <FailingChecks checks={c.verdict.checks} />
            {(c.verdict.messages ?? []).map((m) => (
              <p key={m} className="mt-1 text-xs text-ink-700">
                {m}
              </p>
            ))}
            <RequirementFlags outcomes={c.verdict.requirements} showRows />
            {editable || notes[c.id] ? (
              <label className="mt-2 block text-xs font-semibold text-ink-700">
                Your note on this verdict
                <textarea
                  value={notes[c.id] ?? ""}
                  disabled={!editable}
                  rows={2}
                  maxLength={4000}
                  onChange={(e) => setNotes((n) => ({ ...n, [c.id]: e.target.value }))}
                  onBlur={async () => {
                    if ((notes[c.id] ?? "") === c.note && !state[c.id]) return;
                    setState((s) => ({ ...s, [c.id]: "Saving…" }));
                    const answer = await callApi<{ review: ReviewState }>(`${base}/check-notes/${c.id}`, { method: "PUT", body: { note: notes[c.id] ?? "" } });
                    if (answer.ok) onRevision(answer.data.review.revision);
                    setState((s) => ({ ...s, [c.id]: answer.ok ? "Saved" : answer.error }));
                  }}
                  placeholder="e.g. explained in section 4"
                  className="mt-1 block w-full rounded-chip border border-ink-300 px-2 py-1 font-normal disabled:bg-ink-50"
                />
                {state[c.id] ? <span className="font-normal text-ink-500">{state[c.id]}</span> : null}
              </label>
            ) : null}
          </li>
        ))}
      </ul>
    </section>
  );
}

function DossierPane({
  boardId,
  proposalId,
  versionId,
  html,
  serverText,
  items,
  activeItem,
  onActivate,
  canRaise,
  onRaised,
}: {
  boardId: string;
  proposalId: string;
  versionId: string;
  html: string;
  serverText: string;
  items: ReviewItemView[];
  activeItem: string | null;
  onActivate: (id: string | null) => void;
  canRaise: boolean;
  onRaised: (item: ReviewItemView) => void;
}) {
  const ref = useRef<HTMLDivElement>(null);
  const pane = useRef<HTMLElement>(null);
  const [selection, setSelection] = useState<{ anchor: Anchor | null; quote: string } | null>(null);
  // Where the selection ends, from the top of the pane: the raise-item form opens there.
  const [selectionTop, setSelectionTop] = useState<number | null>(null);
  const [unplaced, setUnplaced] = useState<string[]>([]);

  // Re-render the dossier and its highlights whenever the items change.
  useEffect(() => {
    const root = ref.current;
    if (!root) return;
    root.innerHTML = html;
    const visible = items.filter((i) => i.versionId === versionId);
    const placed = highlight(root, visible, activeItem);
    setUnplaced(visible.filter((i) => !placed.has(i.id)).map((i) => i.id));
  }, [html, items, versionId, activeItem]);

  useEffect(() => {
    const onChange = () => {
      const root = ref.current;
      const sel = window.getSelection();
      if (!root || !sel || sel.rangeCount === 0 || sel.isCollapsed) return;
      const range = sel.getRangeAt(0);
      if (!root.contains(range.commonAncestorContainer)) return;
      const { text, pieces } = domText(root);
      const from = offsetOf(pieces, range.startContainer, range.startOffset);
      const to = offsetOf(pieces, range.endContainer, range.endOffset);
      if (from === null || to === null || to <= from) return;
      const dom = makeAnchor(text, from, to);
      if (!dom.quote.trim()) return;
      // Map the browser's selection onto the server's text by quote and context.
      const resolved = resolveAnchor(serverText, dom);
      setSelection({ anchor: resolved ? makeAnchor(serverText, resolved.from, resolved.to) : null, quote: dom.quote });
      const paneBox = pane.current?.getBoundingClientRect();
      const rangeBox = range.getBoundingClientRect();
      setSelectionTop(paneBox ? rangeBox.bottom - paneBox.top + 8 : null);
    };
    document.addEventListener("selectionchange", onChange);
    return () => document.removeEventListener("selectionchange", onChange);
  }, [serverText]);

  return (
    <section ref={pane} aria-labelledby="dossier-heading" className="relative min-w-0">
      <h2 id="dossier-heading" className="sr-only">
        Dossier
      </h2>
      <div
        ref={ref}
        data-testid="dossier"
        className="prose-dossier rounded-panel border border-ink-200 bg-white p-5 shadow-panel [&_.orbit-check]:my-3 [&_.orbit-check]:rounded-chip [&_.orbit-check]:border [&_.orbit-check]:border-ink-200 [&_.orbit-check]:bg-ink-50 [&_.orbit-check]:p-3 [&_.orbit-check-verdict[data-status=consistent]]:text-holds-700 [&_.orbit-check-verdict[data-status=inconsistent]]:text-drift-700 [&_.orbit-check-verdict[data-status=invalid]]:text-void-700"
        onClick={(e) => {
          const mark = (e.target as HTMLElement).closest("mark[data-item-id]") as HTMLElement | null;
          if (mark) onActivate(mark.dataset.itemId ?? null);
        }}
        dangerouslySetInnerHTML={{ __html: html }}
      />
      {unplaced.length ? (
        <p className="mt-2 text-sm text-ink-600">{unplaced.length} review item(s) could not be placed in the text; they are listed on the right.</p>
      ) : null}
      {canRaise ? (
        <RaiseItemForm
          boardId={boardId}
          proposalId={proposalId}
          selection={selection}
          serverText={serverText}
          // Beside the selected words when there is a selection; at the foot of the dossier otherwise.
          top={selection && selectionTop !== null ? selectionTop : null}
          onTyped={setSelection}
          onClose={() => {
            setSelection(null);
            setSelectionTop(null);
            window.getSelection()?.removeAllRanges();
          }}
          onRaised={(item) => {
            onRaised(item);
            setSelection(null);
            setSelectionTop(null);
            window.getSelection()?.removeAllRanges();
          }}
        />
      ) : null}
    </section>
  );
}

function RaiseItemForm({
  boardId,
  proposalId,
  selection,
  serverText,
  top,
  onTyped,
  onClose,
  onRaised,
}: {
  boardId: string;
  proposalId: string;
  selection: { anchor: Anchor | null; quote: string } | null;
  serverText: string;
  /** Offset from the top of the dossier pane to open the form at (beside a selection), or null. */
  top: number | null;
  onTyped: (selection: { anchor: Anchor | null; quote: string } | null) => void;
  onClose: () => void;
  onRaised: (item: ReviewItemView) => void;
}) {
  const [severity, setSeverity] = useState<"major" | "minor" | "comment">("minor");
  const [typed, setTyped] = useState("");
  const [typedMessage, setTypedMessage] = useState<string | null>(null);
  const [title, setTitle] = useState("");
  const [body, setBody] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  return (
    <form
      data-review-ui=""
      data-placement={top !== null ? "beside-selection" : "foot"}
      aria-labelledby="raise-heading"
      style={top !== null ? { top } : undefined}
      className={`space-y-2 rounded-panel border border-trajectory-400/60 p-4 ${top !== null ? "absolute right-2 left-8 z-20 bg-white shadow-panel ring-2 ring-trajectory-400/40" : "mt-4 bg-trajectory-100/40"}`}
      onSubmit={async (e) => {
        e.preventDefault();
        if (!selection?.anchor) return;
        setPending(true);
        const answer = await callApi<{ item: ReviewItemView }>(`/api/v1/boards/${boardId}/review-items`, {
          method: "POST",
          body: { proposalId, severity, title, body, anchor: selection.anchor },
        });
        setPending(false);
        if (answer.ok) {
          onRaised(answer.data.item);
          setTyped("");
          setTypedMessage(null);
          setTitle("");
          setBody("");
          setError(null);
        } else setError(answer.error);
      }}
    >
      <div className="flex items-baseline justify-between gap-2">
        <h3 id="raise-heading" className="font-semibold">
          Raise a review item
        </h3>
        {top !== null ? (
          <button type="button" onClick={onClose} className="text-sm text-trajectory-700 underline">
            Close
          </button>
        ) : null}
      </div>
      {selection ? (
        <p className="text-sm">
          On:{" "}
          <q data-testid="selected-quote" className="italic">
            {selection.quote.length > 160 ? `${selection.quote.slice(0, 160)}…` : selection.quote}
          </q>
          {!selection.anchor ? (
            <span className="block text-void-700">This selection cannot be anchored in the text; select words within the prose.</span>
          ) : null}
        </p>
      ) : (
        <p className="text-sm text-ink-600">Select text in the dossier to anchor an item to it, or type the words below.</p>
      )}
      <label className="block text-sm font-semibold">
        Or type the words to anchor to
        <input
          value={typed}
          onChange={(e) => {
            const value = e.target.value;
            setTyped(value);
            if (!value.trim()) {
              setTypedMessage(null);
              onTyped(null);
              return;
            }
            const found = anchorForTypedQuote(serverText, value);
            setTypedMessage(found.ok ? null : found.message);
            onTyped(found.ok ? { anchor: found.anchor, quote: found.anchor.quote } : null);
          }}
          aria-describedby="typed-quote-help"
          maxLength={500}
          className="mt-1 block w-full rounded-chip border border-ink-300 bg-white px-2 py-1.5 font-normal"
        />
        <span id="typed-quote-help" className="mt-1 block text-xs font-normal text-ink-600" aria-live="polite">
          {typedMessage ?? "Words that occur once in the dossier, copied or typed."}
        </span>
      </label>
      <div className="grid gap-2 sm:grid-cols-[10rem_1fr]">
        <label className="text-sm font-semibold">
          Severity
          <select
            value={severity}
            onChange={(e) => setSeverity(e.target.value as typeof severity)}
            className="mt-1 block w-full rounded-chip border border-ink-300 bg-white px-2 py-1.5 font-normal"
          >
            <option value="major">Major</option>
            <option value="minor">Minor</option>
            <option value="comment">Comment</option>
          </select>
        </label>
        <label className="text-sm font-semibold">
          Title
          <input
            value={title}
            onChange={(e) => setTitle(e.target.value)}
            required
            maxLength={200}
            className="mt-1 block w-full rounded-chip border border-ink-300 bg-white px-2 py-1.5 font-normal"
          />
        </label>
      </div>
      <label className="block text-sm font-semibold">
        What needs attention
        <textarea
          value={body}
          onChange={(e) => setBody(e.target.value)}
          required
          rows={3}
          maxLength={20000}
          className="mt-1 block w-full rounded-chip border border-ink-300 bg-white px-2 py-1.5 font-normal"
        />
      </label>
      {error ? (
        <p role="alert" className="text-sm text-void-700">
          {error}
        </p>
      ) : null}
      <button
        type="submit"
        disabled={!selection?.anchor || pending}
        className="rounded-chip bg-trajectory-600 px-3 py-1.5 text-sm font-semibold text-white hover:bg-trajectory-700 disabled:opacity-50"
      >
        {pending ? "Raising…" : "Raise item"}
      </button>
    </form>
  );
}

type Levels = { confidence: ReviewerLevel | null; expertise: ReviewerLevel | null };

/** The reviewer's confidence in their judgement and expertise in the subject: two named radio groups (arrow keys move within each). */
function ReviewerLevels({ levels, disabled, onChange }: { levels: Levels; disabled: boolean; onChange: (next: Levels) => void }) {
  const groups = [
    { key: "confidence", legend: "Your confidence in this review", labels: CONFIDENCE_LABELS },
    { key: "expertise", legend: "Your expertise in the subject", labels: EXPERTISE_LABELS },
  ] as const;
  return (
    <div className="mt-4 grid gap-4 sm:grid-cols-2">
      {groups.map((g) => (
        <fieldset key={g.key} disabled={disabled} data-level-group={g.key}>
          <legend className="text-sm font-semibold text-ink-800">{g.legend}</legend>
          <p className="text-xs text-ink-500">Shown to the chair; it does not weight your scores.</p>
          <div className="mt-1 space-y-1">
            {REVIEWER_LEVELS.map((level) => (
              <label key={level} className="flex items-center gap-2 text-sm">
                <input
                  type="radio"
                  name={`review-${g.key}`}
                  value={level}
                  checked={levels[g.key] === level}
                  onChange={() => onChange({ ...levels, [g.key]: level })}
                  className="accent-trajectory-600"
                />
                {g.labels[level]}
              </label>
            ))}
          </div>
        </fieldset>
      ))}
    </div>
  );
}
