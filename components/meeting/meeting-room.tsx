"use client";
// The panel meeting page: every member follows the chair live through server-sent events
// (EventSource on /api/v1/.../meeting/events); the chair steps through the order and records
// the panel's view. The server checks the session and the policy on every call.
import { useEffect, useId, useState } from "react";
import { callApi, formatScore } from "@/components/review/api";
import { FormNotice, SelectField } from "@/components/ui/form-controls";
import { Panel } from "@/components/ui/panel";
import type { MeetingView } from "@/lib/dal/meetings";
import { formatDateTime } from "@/lib/format/dates";
import { MEETING_NOTES_MAX, RECOMMENDATIONS } from "@/lib/validation/meetings";

const button = "rounded-chip px-3 py-1.5 font-semibold disabled:opacity-60";
const brand = `${button} bg-trajectory-600 text-white hover:bg-trajectory-700`;
const quiet = `${button} border border-ink-300 bg-white text-ink-800 hover:border-trajectory-500`;

const SEVERITY = { major: "Major", minor: "Minor", comment: "Comment" } as const;

export function MeetingRoom({ boardId, callId, initial }: { boardId: string; callId: string; initial: MeetingView }) {
  const base = `/api/v1/boards/${boardId}/calls/${callId}`;
  const [view, setView] = useState(initial);
  const [link, setLink] = useState<"connecting" | "live" | "reconnecting" | "ended">("connecting");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  useEffect(() => {
    const source = new EventSource(`${base}/meeting/events`);
    source.addEventListener("open", () => setLink("live"));
    source.addEventListener("meeting", (event) => {
      setLink("live");
      setView(JSON.parse((event as MessageEvent<string>).data) as MeetingView);
    });
    source.addEventListener("closed", (event) => {
      setLink("ended");
      setError((JSON.parse((event as MessageEvent<string>).data) as { error: string }).error);
      source.close();
    });
    source.addEventListener("error", () => setLink(source.readyState === EventSource.CLOSED ? "ended" : "reconnecting"));
    return () => source.close();
  }, [base]);

  const run = async (url: string, method: string, body?: unknown) => {
    setBusy(true);
    setError(null);
    const answer = await callApi<MeetingView>(url, { method, body });
    setBusy(false);
    if (answer.ok) {
      setView(answer.data);
      return true;
    }
    setError(answer.error);
    return false;
  };

  const chair = view.me.isChair;
  const currentIndex = view.current ? view.agenda.findIndex((a) => a.proposalId === view.current!.proposalId) : -1;
  const move = (index: number) => {
    const target = view.agenda[index];
    if (target) void run(`${base}/meeting/current`, "PUT", { proposalId: target.proposalId });
  };

  return (
    <div className="space-y-6">
      <p className="text-sm text-ink-600" data-meeting-link={link}>
        {link === "live"
          ? "Following live: this page changes when the chair moves on."
          : link === "reconnecting"
            ? "Connection lost; reconnecting…"
            : link === "ended"
              ? "This page no longer follows the meeting. Reload to reconnect."
              : "Connecting…"}
      </p>
      {error ? <FormNotice tone="error">{error}</FormNotice> : null}

      {view.status === "not started" ? (
        chair ? (
          <StartMeeting candidates={view.candidates} rankBy={view.rankBy} busy={busy} onStart={(order) => void run(`${base}/meeting`, "POST", { order })} />
        ) : (
          <Panel title="Not started">
            <p>The chair has not started the panel meeting yet. This page updates when it starts.</p>
          </Panel>
        )
      ) : null}

      {view.status !== "not started" ? (
        <>
          <div className="flex flex-wrap items-center gap-3">
            <span className="rounded-chip bg-ink-100 px-2 py-0.5 text-sm">{view.status === "closed" ? "Meeting closed" : "Meeting running"}</span>
            {view.startedAt ? <span className="text-sm text-ink-600">Started {formatDateTime(view.startedAt)}</span> : null}
            {view.status === "running" ? (
              <button
                type="button"
                className={quiet}
                disabled={busy}
                onClick={() => void run(`${base}/meeting/attendance`, "PUT", { present: !view.me.present })}
              >
                {view.me.present ? "Mark me away" : "Mark me present"}
              </button>
            ) : null}
            {chair ? (
              <a href={`${base}/meeting/minutes`} className="text-trajectory-700 underline" download>
                Minutes (PDF)
              </a>
            ) : null}
          </div>

          <section aria-labelledby="current-heading" className="rounded-panel border border-trajectory-400/50 bg-white p-5 shadow-panel">
            <div aria-live="polite">
              <h2 id="current-heading" className="text-lg font-semibold text-ink-900">
                {view.current
                  ? view.current.steppedOut
                    ? `Now discussing proposal ${view.current.position} of ${view.agenda.length}`
                    : `Now discussing: ${view.current.title ?? ""}`
                  : "No proposal under discussion"}
              </h2>
            </div>
            {view.current ? <CurrentProposal view={view} /> : null}
            {chair && view.status === "running" && view.current ? (
              <div className="mt-4 flex flex-wrap gap-2">
                <button type="button" className={quiet} disabled={busy || currentIndex <= 0} onClick={() => move(currentIndex - 1)}>
                  Previous proposal
                </button>
                <button type="button" className={brand} disabled={busy || currentIndex >= view.agenda.length - 1} onClick={() => move(currentIndex + 1)}>
                  Next proposal
                </button>
              </div>
            ) : null}
          </section>

          {chair && view.current && !view.current.steppedOut ? (
            <RecordForm
              key={view.current.proposalId}
              scale={view.scale}
              record={view.current.record}
              closed={view.status === "closed"}
              busy={busy}
              onSave={(body) => run(`${base}/meeting/records/${view.current!.proposalId}`, "PUT", body)}
            />
          ) : null}

          <Panel id="meeting-order" title="Order of discussion" description={chair ? "Choose a proposal to move the meeting to it." : undefined}>
            <ol className="divide-y divide-ink-100">
              {view.agenda.map((a, i) => {
                const isCurrent = view.current?.proposalId === a.proposalId;
                const label = a.title ?? "A proposal you have a conflict with";
                return (
                  <li key={a.proposalId} className="flex flex-wrap items-center justify-between gap-2 py-1.5">
                    <span aria-current={isCurrent ? "step" : undefined} className={isCurrent ? "font-semibold" : undefined}>
                      {a.position}. {label}
                      {isCurrent ? " (now)" : ""}
                    </span>
                    <span className="flex items-center gap-2 text-sm">
                      {a.recorded ? <span className="rounded-chip bg-holds-100 px-2 py-0.5 text-holds-700">Recorded</span> : null}
                      {chair && view.status === "running" && !isCurrent ? (
                        <button type="button" className={quiet} disabled={busy} onClick={() => move(i)}>
                          Discuss {label}
                        </button>
                      ) : null}
                    </span>
                  </li>
                );
              })}
            </ol>
          </Panel>

          <Panel id="meeting-panel" title="Panel">
            <ul className="divide-y divide-ink-100 text-sm">
              {view.panel.map((p) => (
                <li key={p.userId} className="flex flex-wrap items-center justify-between gap-2 py-1.5">
                  <span>
                    {p.name} <span className="text-ink-600">({p.role === "chair" ? "chair" : "reviewer"})</span>
                  </span>
                  <span className="flex gap-2">
                    <span className={`rounded-chip px-2 py-0.5 ${p.present ? "bg-holds-100 text-holds-700" : "bg-ink-100 text-ink-700"}`}>
                      {p.present ? "Present" : "Not marked present"}
                    </span>
                    {p.steppingOut ? <span className="rounded-chip bg-drift-100 px-2 py-0.5 text-drift-700">Stepping out (conflict)</span> : null}
                  </span>
                </li>
              ))}
            </ul>
          </Panel>

          {chair && view.status === "running" ? (
            <p>
              <button
                type="button"
                className={quiet}
                disabled={busy}
                onClick={() => {
                  if (window.confirm("Close the meeting? Its records become final.")) void run(`${base}/meeting/close`, "POST");
                }}
              >
                Close the meeting
              </button>
            </p>
          ) : null}
        </>
      ) : null}
    </div>
  );
}

function CurrentProposal({ view }: { view: MeetingView }) {
  const current = view.current!;
  if (current.steppedOut)
    return (
      <p className="mt-2 rounded-chip border border-drift-500/40 bg-drift-100 px-3 py-2 text-drift-700" role="status">
        You have a conflict with this proposal: you step out while the panel discusses it. This page shows nothing of it and follows again when the chair moves
        on.
      </p>
    );
  const s = current.scores;
  return (
    <div className="mt-3 space-y-4">
      {s ? (
        <div>
          <dl className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[12rem_1fr]">
            <dt className="font-semibold">Raw mean</dt>
            <dd data-raw-mean="">
              {formatScore(s.rawMean)} (rank {s.rawRank})
            </dd>
            <dt className="font-semibold">Calibrated mean</dt>
            <dd data-calibrated-mean="">
              {formatScore(s.calibratedMean)} (rank {s.calibratedRank})
            </dd>
            <dt className="font-semibold">Spread (sample std. dev.)</dt>
            <dd>{formatScore(s.spread)}</dd>
            <dt className="font-semibold">Reviews</dt>
            <dd>{s.count}</dd>
          </dl>
          {s.rankNote ? <p className="mt-1 text-sm text-drift-700">{s.rankNote}.</p> : null}
          <table className="mt-3 text-sm">
            <caption className="text-left font-semibold">Scores by reviewer{view.scale ? ` (scale ${view.scale.min} to ${view.scale.max})` : ""}</caption>
            <thead>
              <tr>
                <th scope="col" className="pr-6 text-left">
                  Reviewer
                </th>
                <th scope="col" className="pr-6 text-right">
                  Weighted total
                </th>
                <th scope="col" className="text-left">
                  Flag
                </th>
              </tr>
            </thead>
            <tbody>
              {s.reviews.map((r, i) => (
                <tr key={`${r.label}-${i}`}>
                  <td className="pr-6">{r.label}</td>
                  <td className="pr-6 text-right font-mono">{formatScore(r.total)}</td>
                  <td>
                    {r.outlier ? (
                      <span className="text-void-700">
                        Outlying: {formatScore(Math.abs(r.deviations ?? 0), 1)} standard deviations {(r.deviations ?? 0) < 0 ? "below" : "above"} the others
                      </span>
                    ) : (
                      ""
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : (
        <p className="text-sm text-ink-600">No submitted reviews on the latest version yet.</p>
      )}
      <div>
        <h3 className="font-semibold">Open review items</h3>
        {current.openItems.length === 0 ? (
          <p className="text-sm text-ink-600">None open.</p>
        ) : (
          <ul className="list-disc pl-5 text-sm">
            {current.openItems.map((item) => (
              <li key={item.id}>
                <span className="font-semibold">{SEVERITY[item.severity]}:</span> {item.title}
              </li>
            ))}
          </ul>
        )}
      </div>
      {current.record && !view.me.isChair ? (
        <div className="text-sm" data-meeting-record="">
          <h3 className="font-semibold">The panel&apos;s record</h3>
          <p>
            Consensus score {formatScore(current.record.consensusScore)}; recommendation: {current.record.recommendation ?? "none yet"}.
          </p>
          {current.record.notes ? <p className="whitespace-pre-line">{current.record.notes}</p> : null}
        </div>
      ) : null}
    </div>
  );
}

function StartMeeting({
  candidates,
  rankBy,
  busy,
  onStart,
}: {
  candidates: MeetingView["candidates"];
  rankBy: MeetingView["rankBy"];
  busy: boolean;
  onStart: (order: string[]) => void;
}) {
  const [order, setOrder] = useState(() => candidates.map((c) => ({ ...c, included: true })));
  const swap = (i: number, j: number) =>
    setOrder((list) => {
      const next = [...list];
      [next[i], next[j]] = [next[j]!, next[i]!];
      return next;
    });
  return (
    <Panel
      title="Start the panel meeting"
      description={`Proposals in the order the overview ranks them (${rankBy === "calibrated" ? "calibrated" : "raw"} means). Move them or leave some out, then start.`}
    >
      {order.length === 0 ? (
        <p>No proposal of this call has been submitted for review yet.</p>
      ) : (
        <ol className="divide-y divide-ink-100">
          {order.map((c, i) => (
            <li key={c.proposalId} className="flex flex-wrap items-center justify-between gap-2 py-1.5">
              <label className="flex items-center gap-2">
                <input
                  type="checkbox"
                  className="h-4 w-4 accent-trajectory-600"
                  checked={c.included}
                  onChange={(e) => setOrder((list) => list.map((x, k) => (k === i ? { ...x, included: e.target.checked } : x)))}
                />
                <span>
                  {i + 1}. {c.title}{" "}
                  <span className="text-sm text-ink-600">
                    (raw {formatScore(c.rawMean)}, calibrated {formatScore(c.calibratedMean)})
                  </span>
                </span>
              </label>
              <span className="flex gap-1">
                <button type="button" className={quiet} disabled={i === 0} onClick={() => swap(i, i - 1)} aria-label={`Move ${c.title} up`}>
                  Up
                </button>
                <button type="button" className={quiet} disabled={i === order.length - 1} onClick={() => swap(i, i + 1)} aria-label={`Move ${c.title} down`}>
                  Down
                </button>
              </span>
            </li>
          ))}
        </ol>
      )}
      <p className="mt-4">
        <button
          type="button"
          className={brand}
          disabled={busy || !order.some((c) => c.included)}
          onClick={() => onStart(order.filter((c) => c.included).map((c) => c.proposalId))}
        >
          Start the meeting
        </button>
      </p>
    </Panel>
  );
}

function RecordForm({
  scale,
  record,
  closed,
  busy,
  onSave,
}: {
  scale: MeetingView["scale"];
  record: NonNullable<MeetingView["current"]>["record"];
  closed: boolean;
  busy: boolean;
  onSave: (body: unknown) => Promise<boolean>;
}) {
  const id = useId();
  const [score, setScore] = useState(record?.consensusScore === null || record?.consensusScore === undefined ? "" : String(record.consensusScore));
  const [recommendation, setRecommendation] = useState(record?.recommendation ?? "");
  const [notes, setNotes] = useState(record?.notes ?? "");
  const [scoreError, setScoreError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const submit = async (event: React.FormEvent) => {
    event.preventDefault();
    setSaved(false);
    const text = score.trim().replace(",", ".");
    const value = text === "" ? null : Number(text);
    if (value !== null && !Number.isFinite(value)) {
      setScoreError("Enter the consensus score as a number, for example 3.5, or leave it empty.");
      return;
    }
    setScoreError(null);
    if (await onSave({ consensusScore: value, recommendation: recommendation === "" ? null : recommendation, notes })) setSaved(true);
  };
  return (
    <Panel title="The panel's record" description="What the panel settled for this proposal. Panel members see it when saved.">
      <form onSubmit={(e) => void submit(e)} className="space-y-3">
        <div>
          <label htmlFor={`${id}-score`} className="block text-sm font-semibold text-ink-800">
            Consensus score{scale ? ` (${scale.min} to ${scale.max})` : ""}
          </label>
          <input
            id={`${id}-score`}
            inputMode="decimal"
            value={score}
            disabled={closed}
            onChange={(e) => setScore(e.target.value)}
            aria-invalid={scoreError ? true : undefined}
            aria-describedby={scoreError ? `${id}-score-error` : undefined}
            className="mt-1 block w-40 rounded-chip border border-ink-300 bg-white px-3 py-2"
          />
          {scoreError ? (
            <p id={`${id}-score-error`} className="mt-1 text-sm text-void-700">
              {scoreError}
            </p>
          ) : null}
        </div>
        <SelectField label="Recommendation" name="recommendation" value={recommendation} disabled={closed} onChange={(e) => setRecommendation(e.target.value)}>
          <option value="">No recommendation yet</option>
          {RECOMMENDATIONS.map((r) => (
            <option key={r} value={r}>
              {r[0]!.toUpperCase() + r.slice(1)}
            </option>
          ))}
        </SelectField>
        <div>
          <label htmlFor={`${id}-notes`} className="block text-sm font-semibold text-ink-800">
            Notes
          </label>
          <textarea
            id={`${id}-notes`}
            value={notes}
            maxLength={MEETING_NOTES_MAX}
            disabled={closed}
            rows={4}
            onChange={(e) => setNotes(e.target.value)}
            aria-describedby={`${id}-notes-count`}
            className="mt-1 block w-full rounded-chip border border-ink-300 bg-white px-3 py-2"
          />
          <p id={`${id}-notes-count`} className="mt-1 text-right text-xs text-ink-500">
            {notes.length} of {MEETING_NOTES_MAX} characters
          </p>
        </div>
        {closed ? (
          <p className="text-sm text-ink-600">The meeting is closed; this record is final.</p>
        ) : (
          <button type="submit" className={brand} disabled={busy}>
            Save the record
          </button>
        )}
        {saved ? <FormNotice tone="success">Record saved.</FormNotice> : null}
      </form>
    </Panel>
  );
}
