"use client";
// The chair's control of a call's response round: start and end dates typed as people write
// them (UTC), "Open the response round" / "Change the dates", and "Close the round now".
import { useId, useState } from "react";
import { useRouter } from "next/navigation";
import type { ResponseWindowView } from "@/lib/dal/responses";
import { formatDateTime } from "@/lib/format/dates";
import { callApi } from "./api";

const STATE_TEXT = { upcoming: "Not open yet", open: "Open", closed: "Closed" } as const;

/** "12 Dec 2026 14:00": what the fields start from, in the form the parser reads back. */
function asTyped(iso: string): string {
  return formatDateTime(iso).replace(",", "").replace(/ UTC$/, "");
}

export function ResponseWindowForm({ boardId, callId, initial }: { boardId: string; callId: string; initial: ResponseWindowView | null }) {
  const id = useId();
  const router = useRouter();
  const [window, setWindow] = useState(initial);
  const [opensAt, setOpensAt] = useState(initial ? asTyped(initial.opensAt) : "");
  const [closesAt, setClosesAt] = useState(initial ? asTyped(initial.closesAt) : "");
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const url = `/api/v1/boards/${boardId}/calls/${callId}/response-window`;
  return (
    <div className="space-y-3">
      {window ? (
        <p className="text-sm" data-response-window={window.state}>
          <span className="mr-2 rounded-chip bg-ink-100 px-2 py-0.5 font-semibold">{STATE_TEXT[window.state]}</span>
          {formatDateTime(window.opensAt)} – {formatDateTime(window.closesAt)}
          {window.openingMailedAt ? " · proposers were told by e-mail" : ""}
        </p>
      ) : (
        <p className="text-sm text-ink-600">
          No response round yet. Proposers see the review items on their versions only while one is open (or after the decision).
        </p>
      )}
      <form
        className="grid gap-3 sm:grid-cols-[1fr_1fr_auto] sm:items-end"
        onSubmit={async (e) => {
          e.preventDefault();
          setPending(true);
          const answer = await callApi<{ window: ResponseWindowView }>(url, { method: "PUT", body: { opensAt, closesAt } });
          setPending(false);
          if (answer.ok) {
            setWindow(answer.data.window);
            setError(null);
            setDone(window ? "The dates were changed." : `The response round is ${answer.data.window.state === "open" ? "open" : "set"}.`);
            router.refresh();
          } else {
            setDone(null);
            setError(answer.error);
          }
        }}
      >
        <div>
          <label htmlFor={`${id}-opens`} className="block text-sm font-semibold text-ink-800">
            Start (UTC)
          </label>
          <input
            id={`${id}-opens`}
            value={opensAt}
            onChange={(e) => setOpensAt(e.target.value)}
            required
            maxLength={60}
            aria-describedby={`${id}-hint`}
            placeholder="e.g. 12 Dec 2026"
            className="mt-1 w-full rounded-chip border border-ink-300 px-2 py-1"
          />
        </div>
        <div>
          <label htmlFor={`${id}-closes`} className="block text-sm font-semibold text-ink-800">
            End (UTC)
          </label>
          <input
            id={`${id}-closes`}
            value={closesAt}
            onChange={(e) => setClosesAt(e.target.value)}
            required
            maxLength={60}
            aria-describedby={`${id}-hint`}
            placeholder="e.g. 26 Dec 2026 17:00"
            className="mt-1 w-full rounded-chip border border-ink-300 px-2 py-1"
          />
        </div>
        <button
          type="submit"
          disabled={pending}
          aria-busy={pending}
          className="rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white hover:bg-trajectory-700 disabled:opacity-60"
        >
          {pending ? "Working…" : window ? "Change the dates" : "Open the response round"}
        </button>
        <p id={`${id}-hint`} className="text-xs text-ink-500 sm:col-span-3">
          Write dates as “12 Dec 2026”, “2026-12-12” or “12/12/2026”, with a time such as “14:00” if needed; a day without a time ends at 23:59 UTC. Proposers
          are e-mailed when the round opens, two days before it ends, and when it closes.
        </p>
      </form>
      {window && window.state !== "closed" ? (
        <button
          type="button"
          className="rounded-chip border border-ink-300 px-3 py-1.5 text-sm font-semibold hover:border-void-500"
          onClick={async () => {
            const answer = await callApi<{ window: ResponseWindowView }>(`${url}/close`, { method: "POST" });
            if (answer.ok) {
              setWindow(answer.data.window);
              setError(null);
              setDone("The response round is closed.");
              router.refresh();
            } else setError(answer.error);
          }}
        >
          Close the round now
        </button>
      ) : null}
      {error ? (
        <p role="alert" className="text-sm text-void-700">
          {error}
        </p>
      ) : null}
      {done ? (
        <p role="status" className="text-sm text-holds-700">
          {done}
        </p>
      ) : null}
    </div>
  );
}
