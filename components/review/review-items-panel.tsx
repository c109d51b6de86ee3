"use client";
// Review items with their threads. Names are as the server labelled them for this viewer:
// proposers only ever see "Reviewer 1", "Reviewer 2"...
import { formatDateTime } from "@/lib/format/dates";
import { useState } from "react";
import type { ReviewItemView } from "@/lib/dal/review-items";
import { callApi } from "./api";
import { SeverityChip } from "./severity-chip";
import { ItemResponse, type AnswerSectionOption } from "./item-response";

export function ReviewItemsPanel({
  boardId,
  items,
  activeItem,
  onActivate,
  onChange,
  canModerate = false,
  answerSections,
}: {
  boardId: string;
  items: ReviewItemView[];
  activeItem?: string | null;
  onActivate?: (id: string | null) => void;
  onChange: (item: ReviewItemView) => void;
  /** The chair may resolve anyone's item. */
  canModerate?: boolean;
  /** Newer versions' sections an answer may point at (the response round). */
  answerSections?: AnswerSectionOption[];
}) {
  const [filter, setFilter] = useState<"all" | "open">("all");
  const shown = items.filter((i) => filter === "all" || i.status === "open");
  return (
    <section aria-labelledby="items-heading" className="rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="items-heading" className="text-lg font-semibold">
          Review items <span className="text-sm font-normal text-ink-500">({items.length})</span>
        </h2>
        <label className="text-sm">
          Show{" "}
          <select
            value={filter}
            onChange={(e) => setFilter(e.target.value as "all" | "open")}
            className="rounded-chip border border-ink-300 bg-white px-2 py-1"
          >
            <option value="all">all</option>
            <option value="open">open only</option>
          </select>
        </label>
      </div>
      {shown.length === 0 ? <p className="text-sm text-ink-600">No review items you can see yet.</p> : null}
      <ol className="space-y-3">
        {shown.map((item) => (
          <ItemCard
            key={item.id}
            boardId={boardId}
            item={item}
            active={activeItem === item.id}
            onActivate={onActivate}
            onChange={onChange}
            canModerate={canModerate}
            answerSections={answerSections}
          />
        ))}
      </ol>
    </section>
  );
}

function ItemCard({
  boardId,
  item,
  active,
  onActivate,
  onChange,
  canModerate,
  answerSections,
}: {
  boardId: string;
  item: ReviewItemView;
  active: boolean;
  onActivate?: (id: string | null) => void;
  onChange: (item: ReviewItemView) => void;
  canModerate: boolean;
  answerSections?: AnswerSectionOption[];
}) {
  const [reply, setReply] = useState("");
  const [error, setError] = useState<string | null>(null);
  const url = `/api/v1/boards/${boardId}/review-items/${item.id}`;
  return (
    <li
      data-item={item.id}
      className={`rounded-chip border p-3 ${active ? "border-trajectory-500" : "border-ink-100"} ${item.status === "resolved" ? "opacity-75" : ""}`}
    >
      <div className="flex flex-wrap items-center gap-2">
        <SeverityChip severity={item.severity} />
        <button
          type="button"
          className="text-left font-semibold text-trajectory-700 hover:underline"
          onClick={() => {
            onActivate?.(item.id);
            document.querySelector(`mark[data-item-id="${item.id}"]`)?.scrollIntoView({ behavior: "smooth", block: "center" });
          }}
        >
          {item.title}
        </button>
        {item.status === "resolved" ? <span className="rounded-chip bg-holds-100 px-2 py-0.5 text-xs font-semibold text-holds-700">Resolved</span> : null}
      </div>
      <blockquote className="mt-1 border-l-2 border-ink-200 pl-2 text-sm italic text-ink-600">{item.anchor.quote}</blockquote>
      <p className="mt-1 whitespace-pre-wrap text-sm">{item.body}</p>
      <p className="mt-1 text-xs text-ink-500">
        {item.authorLabel} · version {item.versionNumber} · {formatDateTime(item.createdAt)}
      </p>
      {item.replies.length ? (
        <ul className="mt-2 space-y-1 border-l-2 border-trajectory-100 pl-3">
          {item.replies.map((r) => (
            <li key={r.id} className="text-sm">
              <span className="font-semibold">{r.authorLabel}:</span> <span className="whitespace-pre-wrap">{r.body}</span>
            </li>
          ))}
        </ul>
      ) : null}
      <form
        className="mt-2 flex gap-2"
        onSubmit={async (e) => {
          e.preventDefault();
          const answer = await callApi<{ item: ReviewItemView }>(`${url}/replies`, { method: "POST", body: { body: reply } });
          if (answer.ok) {
            onChange(answer.data.item);
            setReply("");
            setError(null);
          } else setError(answer.error);
        }}
      >
        <label className="sr-only" htmlFor={`reply-${item.id}`}>
          Reply to {item.title}
        </label>
        <input
          id={`reply-${item.id}`}
          value={reply}
          onChange={(e) => setReply(e.target.value)}
          required
          maxLength={20000}
          placeholder="Reply…"
          className="min-w-0 flex-1 rounded-chip border border-ink-300 px-2 py-1 text-sm"
        />
        <button type="submit" className="rounded-chip border border-ink-300 px-2 py-1 text-sm font-semibold hover:border-trajectory-500">
          Reply
        </button>
        {item.mine || canModerate ? (
          <button
            type="button"
            className="rounded-chip border border-ink-300 px-2 py-1 text-sm hover:border-trajectory-500"
            onClick={async () => {
              const answer = await callApi<{ item: ReviewItemView }>(url, { method: "PATCH", body: { status: item.status === "open" ? "resolved" : "open" } });
              if (answer.ok) onChange(answer.data.item);
              else setError(answer.error);
            }}
          >
            {item.status === "open" ? "Resolve" : "Reopen"}
          </button>
        ) : null}
      </form>
      {error ? (
        <p role="alert" className="mt-1 text-sm text-void-700">
          {error}
        </p>
      ) : null}
      <ItemResponse boardId={boardId} item={item} onChange={onChange} sections={answerSections} />
    </li>
  );
}
