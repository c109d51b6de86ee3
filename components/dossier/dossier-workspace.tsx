"use client";
// The author's workspace: the editor, the live summary beside it, attachments, autosave
// with optimistic concurrency, and submission. Nothing typed is lost: a stale save keeps the
// text in the editor and offers to reload the latest revision and reapply it, merging block by
// block when the two edits touched different parts (lib/dossier/merge.ts).
import { useEffect, useMemo, useRef, useState } from "react";
import { useRouter } from "next/navigation";
import { DossierEditor, useDossierEditor } from "@/components/editor/editor";
import { DraftAttachmentsProvider } from "@/components/editor/extensions/orbit-check/attachments-context";
import { AttachmentUploader, type AttachmentItem } from "@/components/upload/attachment-uploader";
import { OrbitFilesPanel } from "@/components/orbit-files/orbit-files-panel";
import type { FileComparisonTolerance } from "@/lib/orbit-files/tolerance";
import { deltaVBudget, evaluateBlocks, extractOrbitChecks, type ToleranceInput } from "@/lib/dossier/claims";
import { mergeDocuments } from "@/lib/dossier/merge";
import { renderDossierHtml } from "@/lib/dossier/render";
import { DossierSummary } from "./dossier-summary";
import { formatDateTime, formatTime } from "@/lib/format/dates";
import { BudgetRail, type RailRequirement } from "./budget-rail";
import { requiredDeltaVMargin } from "@/lib/requirements";

export const AUTOSAVE_DELAY_MS = 1500;

// A keepalive request may carry at most 64 KiB; larger drafts rely on the unload warning.
const KEEPALIVE_LIMIT = 60_000;

/**
 * Saves still running after their workspace unmounted (Back, a link), by proposal: a workspace
 * mounting again waits for them before it asks the server for the latest revision, so it
 * never shows, or builds on, the text from before them.
 */
const pendingFlushes = new Map<string, Promise<unknown>>();

type SaveState =
  { kind: "saved"; at: string | null } | { kind: "dirty" } | { kind: "saving" } | { kind: "conflict"; message: string } | { kind: "error"; message: string };

interface Problem {
  message: string;
  blockId?: string;
}

export interface DossierWorkspaceProps {
  boardId: string;
  proposalId: string;
  draft: { revision: number; document: Record<string, unknown>; updatedAt: string };
  tolerance: ToleranceInput;
  /** The call's bounds for comparing orbit files with the text. */
  fileTolerance?: FileComparisonTolerance;
  /** The call's requirements, judged live in the rail. */
  requirements?: RailRequirement[];
  requiredSections: string[];
  attachments: AttachmentItem[];
  nextVersion: number;
  callOpen: boolean;
  callClosesAt: string;
}

export function DossierWorkspace(props: DossierWorkspaceProps) {
  const { boardId, proposalId } = props;
  const router = useRouter();
  const [doc, setDoc] = useState(props.draft.document);
  const [saveState, setSaveState] = useState<SaveState>({ kind: "saved", at: props.draft.updatedAt });
  const [attachments, setAttachments] = useState(props.attachments);
  const [replaced, setReplaced] = useState<{ revision: number; document: Record<string, unknown> } | null>(null);
  const [submitting, setSubmitting] = useState(false);
  const [submitError, setSubmitError] = useState<{ message: string; problems: Problem[] } | null>(null);
  const revision = useRef(props.draft.revision);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const inFlight = useRef<Promise<boolean> | null>(null);
  const dirty = useRef(false);
  const conflicted = useRef(false);
  const latestDoc = useRef(props.draft.document);
  // The last revision this tab knows the server holds: the base of a three-way merge.
  const baseDoc = useRef(props.draft.document);
  const [mergedWith, setMergedWith] = useState<number | null>(null);

  // The save and schedule functions read only refs, so the editor's onUpdate (bound once)
  // always reaches the current ones through saveRef.
  const saveRef = useRef<(options?: { keepalive?: boolean }) => Promise<boolean>>(async () => false);

  const schedule = () => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void saveRef.current(), AUTOSAVE_DELAY_MS);
  };

  const save = async ({ keepalive = false }: { keepalive?: boolean } = {}): Promise<boolean> => {
    if (conflicted.current) return false;
    if (inFlight.current) {
      await inFlight.current;
      if (!dirty.current) return true;
    }
    const run = (async () => {
      dirty.current = false;
      setSaveState({ kind: "saving" });
      const sent = latestDoc.current;
      const payload = JSON.stringify({ revision: revision.current, document: sent });
      const response = await fetch(`/api/v1/boards/${boardId}/proposals/${proposalId}/draft`, {
        method: "PUT",
        headers: { "content-type": "application/json" },
        body: payload,
        // Leaving the page (pagehide, a hidden tab) must not cancel the save.
        keepalive: keepalive && payload.length < KEEPALIVE_LIMIT,
      }).catch(() => null);
      if (!response) {
        dirty.current = true;
        setSaveState({ kind: "error", message: "Could not reach the server; your text is kept here and will be saved when you edit again or press Save now." });
        return false;
      }
      const body = (await response.json().catch(() => ({}))) as { draft?: { revision: number; updatedAt: string }; error?: string };
      if (response.ok && body.draft) {
        revision.current = body.draft.revision;
        baseDoc.current = sent;
        setSaveState(dirty.current ? { kind: "dirty" } : { kind: "saved", at: body.draft.updatedAt });
        return true;
      }
      dirty.current = true;
      if (response.status === 409 && /changed elsewhere/.test(body.error ?? "")) {
        conflicted.current = true;
        setSaveState({ kind: "conflict", message: body.error ?? "This draft was changed elsewhere." });
      } else {
        setSaveState({ kind: "error", message: body.error ?? `Saving failed (${response.status}).` });
      }
      return false;
    })();
    inFlight.current = run;
    const ok = await run;
    inFlight.current = null;
    if (ok && dirty.current) schedule();
    return ok;
  };

  useEffect(() => {
    saveRef.current = save;
  });

  const onUpdate = (next: Record<string, unknown>) => {
    latestDoc.current = next;
    dirty.current = true;
    setDoc(next);
    if (!conflicted.current) {
      setSaveState({ kind: "dirty" });
      schedule();
    }
  };

  const editor = useDossierEditor({ content: props.draft.document, tolerance: props.tolerance, onUpdate });

  // Nothing typed is lost by leaving: a pending autosave is sent at once when the page is hidden
  // or left (pagehide, a hidden tab, Back or a link inside the app unmounting the workspace),
  // and closing or reloading the page with unsaved text asks first.
  useEffect(() => {
    const flush = () => {
      if (!dirty.current || conflicted.current) return null;
      if (timer.current) clearTimeout(timer.current);
      timer.current = null;
      return saveRef.current({ keepalive: true });
    };
    const warn = (e: BeforeUnloadEvent) => {
      if (!dirty.current) return;
      e.preventDefault();
      e.returnValue = "";
    };
    const onPageHide = () => void flush();
    const onVisibility = () => {
      if (document.visibilityState === "hidden") void flush();
    };
    window.addEventListener("beforeunload", warn);
    window.addEventListener("pagehide", onPageHide);
    document.addEventListener("visibilitychange", onVisibility);
    return () => {
      window.removeEventListener("beforeunload", warn);
      window.removeEventListener("pagehide", onPageHide);
      document.removeEventListener("visibilitychange", onVisibility);
      const pending = flush() ?? inFlight.current;
      if (timer.current) clearTimeout(timer.current);
      if (pending) {
        const done = pending.finally(() => {
          if (pendingFlushes.get(proposalId) === done) pendingFlushes.delete(proposalId);
        });
        pendingFlushes.set(proposalId, done);
      }
    };
  }, [proposalId]);

  // Back and Forward can bring back this page as the router cached it, with an older revision
  // than the server now holds (a save sent on leaving, another tab). Once any save still
  // running from before has landed, load the latest and show it unless something was typed.
  useEffect(() => {
    if (!editor) return;
    let cancelled = false;
    const refresh = async () => {
      await pendingFlushes.get(proposalId)?.catch(() => undefined);
      const response = await fetch(`/api/v1/boards/${boardId}/proposals/${proposalId}/draft`, { cache: "no-store" }).catch(() => null);
      if (cancelled || !response?.ok) return;
      const { draft } = (await response.json()) as { draft: { revision: number; document: Record<string, unknown>; updatedAt: string } };
      if (cancelled || draft.revision <= revision.current || dirty.current || inFlight.current || conflicted.current) return;
      revision.current = draft.revision;
      baseDoc.current = draft.document;
      latestDoc.current = draft.document;
      editor.commands.setContent(draft.document, { emitUpdate: false });
      setDoc(draft.document);
      setSaveState({ kind: "saved", at: draft.updatedAt });
    };
    void refresh();
    const onPageShow = (e: PageTransitionEvent) => {
      if (e.persisted) void refresh();
    };
    window.addEventListener("pageshow", onPageShow);
    return () => {
      cancelled = true;
      window.removeEventListener("pageshow", onPageShow);
    };
  }, [editor, boardId, proposalId]);

  // Back and Forward can also bring back the attachment list as the router cached it, without an
  // upload or a removal made since: re-read it when the page appears.
  useEffect(() => {
    let cancelled = false;
    const refresh = async () => {
      const response = await fetch(`/api/v1/boards/${boardId}/proposals/${proposalId}/attachments`, { cache: "no-store" }).catch(() => null);
      if (cancelled || !response?.ok) return;
      const body = (await response.json().catch(() => null)) as { attachments?: AttachmentItem[] } | null;
      if (!cancelled && body?.attachments) setAttachments(body.attachments);
    };
    void refresh();
    const onPageShow = (e: PageTransitionEvent) => {
      if (e.persisted) void refresh();
    };
    window.addEventListener("pageshow", onPageShow);
    return () => {
      cancelled = true;
      window.removeEventListener("pageshow", onPageShow);
    };
  }, [boardId, proposalId]);

  /**
   * Loads the latest revision and merges this tab's changes into it block by block. When both
   * changed the same block, this tab's text is saved over the latest revision, which stays
   * readable (and restorable) on the page.
   */
  const reloadAndReapply = async () => {
    const response = await fetch(`/api/v1/boards/${boardId}/proposals/${proposalId}/draft`).catch(() => null);
    if (!response?.ok) {
      setSaveState({ kind: "conflict", message: "Could not load the latest revision; your text is still here. Try again." });
      return;
    }
    const { draft } = (await response.json()) as { draft: { revision: number; document: Record<string, unknown> } };
    const merge = mergeDocuments(baseDoc.current, latestDoc.current, draft.document);
    revision.current = draft.revision;
    baseDoc.current = draft.document;
    conflicted.current = false;
    if (merge.ok && editor) {
      setMergedWith(draft.revision);
      setReplaced(null);
      latestDoc.current = merge.document;
      editor.commands.setContent(merge.document as Record<string, unknown>, { emitUpdate: false });
      setDoc(merge.document);
    } else {
      setMergedWith(null);
      setReplaced({ revision: draft.revision, document: draft.document });
    }
    dirty.current = true;
    await save();
  };

  const restoreReplaced = () => {
    if (!replaced || !editor) return;
    if (!window.confirm("Put the other revision back into the editor? Your own text will be replaced by it.")) return;
    editor.commands.setContent(replaced.document, { emitUpdate: true });
    setReplaced(null);
  };

  const submit = async () => {
    setSubmitError(null);
    setSubmitting(true);
    try {
      if (timer.current) clearTimeout(timer.current);
      if (dirty.current && !(await save())) {
        setSubmitError({ message: "Save the draft first (see the message above the editor).", problems: [] });
        return;
      }
      const response = await fetch(`/api/v1/boards/${boardId}/proposals/${proposalId}/submissions`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ revision: revision.current }),
      }).catch(() => null);
      if (!response) {
        setSubmitError({ message: "Could not reach the server. Nothing was submitted; try again.", problems: [] });
        return;
      }
      const body = (await response.json().catch(() => ({}))) as { error?: string; details?: { problems?: Problem[] } };
      if (!response.ok) {
        setSubmitError({ message: body.error ?? `Submission failed (${response.status}).`, problems: body.details?.problems ?? [] });
        return;
      }
      router.refresh();
    } finally {
      setSubmitting(false);
    }
  };

  const blocks = useMemo(() => extractOrbitChecks(doc), [doc]);
  const evaluations = useMemo(() => evaluateBlocks(blocks, props.tolerance), [blocks, props.tolerance]);
  const items = evaluations.map((e) => ({
    blockId: e.block.blockId,
    label: e.block.label,
    kind: e.block.claim.kind,
    status: e.result.status,
    result: e.result,
  }));
  const budget = useMemo(() => deltaVBudget(evaluations), [evaluations]);
  const attachmentRefs = useMemo(() => attachments.map((a) => ({ id: a.id, filename: a.filename, sha256: a.sha256 })), [attachments]);
  const images = attachments.filter((a) => a.contentType.startsWith("image/")).map((a) => ({ src: a.contentPath, filename: a.filename }));

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_18rem]">
      <div className="space-y-3">
        <SaveStatus state={saveState} onSaveNow={() => void save()} onReapply={() => void reloadAndReapply()} />
        {mergedWith !== null ? (
          <p role="status" className="flex items-center justify-between gap-2 rounded-panel border border-holds-500/40 bg-holds-100 p-3 text-sm text-holds-700">
            Merged with revision {mergedWith}: the other changes and yours were in different parts of the text, so both are kept.
            <button type="button" onClick={() => setMergedWith(null)} className="rounded-chip border border-holds-500/50 bg-white px-2 py-0.5 text-xs">
              Dismiss
            </button>
          </p>
        ) : null}
        {replaced ? (
          <details className="rounded-panel border border-drift-500/40 bg-drift-100 p-3 text-sm">
            <summary className="cursor-pointer font-semibold text-drift-700">Your text replaced revision {replaced.revision}; its content is kept here</summary>
            <div
              className="prose-dossier mt-2 max-h-96 overflow-auto rounded-chip bg-white p-3"
              dangerouslySetInnerHTML={{ __html: renderDossierHtml(replaced.document) }}
            />
            <div className="mt-2 flex gap-2">
              <button type="button" onClick={restoreReplaced} className="rounded-chip border border-ink-300 bg-white px-3 py-1">
                Restore that revision instead
              </button>
              <button type="button" onClick={() => setReplaced(null)} className="rounded-chip border border-ink-300 bg-white px-3 py-1">
                Dismiss
              </button>
            </div>
          </details>
        ) : null}
        <DraftAttachmentsProvider value={attachmentRefs}>
          <DossierEditor editor={editor} images={images} />
        </DraftAttachmentsProvider>
      </div>
      <div className="space-y-4">
        <DossierSummary
          items={items}
          budget={budget}
          source="live"
          requiredMargin={requiredDeltaVMargin(props.requirements ?? [])}
          tolerance={props.tolerance}
        />
        <BudgetRail evaluations={evaluations} requirements={props.requirements ?? []} budget={budget} />
        <section aria-labelledby="submit-heading" className="space-y-2 rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
          <h2 id="submit-heading" className="text-base font-semibold text-ink-900">
            Submit
          </h2>
          <p className="text-xs text-ink-600">
            {props.requiredSections.length > 0 ? `Required sections: ${props.requiredSections.join(", ")}. ` : ""}
            {props.callOpen ? `The call closes ${formatDateTime(props.callClosesAt)}.` : "The call is not open for submissions."} The server recomputes every
            claim when you submit.
          </p>
          <button
            type="button"
            onClick={() => void submit()}
            disabled={submitting || saveState.kind === "conflict"}
            className="w-full rounded-chip bg-trajectory-600 px-3 py-2 font-semibold text-white hover:bg-trajectory-700 disabled:opacity-50"
          >
            {submitting ? "Submitting…" : `Submit version ${props.nextVersion}`}
          </button>
          {submitError ? (
            <div role="alert" className="space-y-1 rounded-chip border border-void-500/40 bg-void-100 p-2 text-sm text-void-700">
              <p>{submitError.problems.length > 0 ? "Not submitted yet. Fix these first:" : submitError.message}</p>
              {submitError.problems.length > 0 ? (
                <ul className="list-disc pl-5">
                  {submitError.problems.map((p, i) => (
                    <li key={i}>
                      {p.blockId ? (
                        <a href={`#orbit-check-${p.blockId}`} className="underline" onClick={(e) => focusBlock(e, p.blockId!)}>
                          {p.message}
                        </a>
                      ) : (
                        p.message
                      )}
                    </li>
                  ))}
                </ul>
              ) : null}
            </div>
          ) : null}
        </section>
        <AttachmentUploader boardId={boardId} proposalId={proposalId} attachments={attachments} editable onAttachmentsChange={setAttachments} />
        <OrbitFilesPanel
          boardId={boardId}
          proposalId={proposalId}
          attachmentIds={attachments.map((a) => a.id)}
          blocks={blocks}
          fileTolerance={props.fileTolerance}
          exportFrom={{ draft: true }}
          onMakeClaim={(made) => {
            if (!editor) return;
            // The block goes at the end of the dossier (never replacing a selected block), linked to the file by id and SHA-256.
            const blockId = crypto.randomUUID();
            editor
              .chain()
              .insertContentAt(editor.state.doc.content.size, {
                type: "orbitCheck",
                attrs: { blockId, label: made.label, claim: made.claim, initialFrom: null, source: made.source },
              })
              .run();
            // Focus moves to the new block's first field (its view mounts a frame later).
            const focusNewBlock = (frames: number) => {
              const input = editor.view.dom.querySelector<HTMLInputElement>(`[data-block-id="${blockId}"] input`);
              if (input) {
                input.scrollIntoView({ block: "center" });
                input.focus();
              } else if (frames > 0) requestAnimationFrame(() => focusNewBlock(frames - 1));
            };
            requestAnimationFrame(() => focusNewBlock(30));
          }}
        />
      </div>
    </div>
  );
}

/** A "Fix …" link moves focus into the block it names (its first field), not only the scroll position. */
function focusBlock(e: React.MouseEvent<HTMLAnchorElement>, blockId: string) {
  const block = document.getElementById(`orbit-check-${blockId}`);
  if (!block) return;
  e.preventDefault();
  const field = block.querySelector<HTMLElement>("input:not([disabled]), select:not([disabled]), textarea:not([disabled]), button:not([disabled])");
  const target = field ?? block;
  if (!field && !block.hasAttribute("tabindex")) block.setAttribute("tabindex", "-1");
  block.scrollIntoView({ block: "center" });
  target.focus({ preventScroll: true });
  history.replaceState(null, "", `#orbit-check-${blockId}`);
}

function SaveStatus({ state, onSaveNow, onReapply }: { state: SaveState; onSaveNow: () => void; onReapply: () => void }) {
  if (state.kind === "conflict") {
    return (
      <div role="alert" className="space-y-2 rounded-panel border border-drift-500/50 bg-drift-100 p-3 text-sm text-drift-700">
        <p>{state.message}</p>
        <button type="button" onClick={onReapply} className="rounded-chip bg-drift-700 px-3 py-1 font-semibold text-white">
          Reload the latest and reapply my changes
        </button>
      </div>
    );
  }
  const text =
    state.kind === "saved"
      ? state.at
        ? `All changes saved (${formatTime(state.at)})`
        : "All changes saved"
      : state.kind === "saving"
        ? "Saving…"
        : state.kind === "dirty"
          ? "Unsaved changes"
          : state.message;
  return (
    <div className="flex items-center justify-between gap-2 text-sm">
      <p role="status" aria-live="polite" data-save-state={state.kind} className={state.kind === "error" ? "text-void-700" : "text-ink-600"}>
        {text}
      </p>
      {state.kind === "error" || state.kind === "dirty" ? (
        <button type="button" onClick={onSaveNow} className="rounded-chip border border-ink-300 px-2 py-0.5 text-xs">
          Save now
        </button>
      ) : null}
    </div>
  );
}
