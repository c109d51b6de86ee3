"use client";
// The review items the viewer may see on a proposal page (proposers: while a response round
// is open or once the decision is issued; reviewers' names are already replaced by the
// server). Replies, answers and dispositions go through the API. Like the other screens that
// change saved state, it re-reads the items when it appears (mount and pageshow), since
// Back/Forward may show a cached page from before the last answer or disposition.
import { useEffect, useState } from "react";
import type { ReviewItemView } from "@/lib/dal/review-items";
import { callApi } from "./api";
import { ReviewItemsPanel } from "./review-items-panel";
import type { AnswerSectionOption } from "./item-response";

export function ProposalReviewItems({
  boardId,
  initialItems,
  answerSections,
}: {
  boardId: string;
  initialItems: ReviewItemView[];
  answerSections?: AnswerSectionOption[];
}) {
  const [items, setItems] = useState(initialItems);
  const proposalId = initialItems[0]?.proposalId;
  useEffect(() => {
    if (!proposalId) return;
    let live = true;
    const reread = async () => {
      const answer = await callApi<{ items: ReviewItemView[] }>(`/api/v1/boards/${boardId}/review-items?proposalId=${encodeURIComponent(proposalId)}`);
      if (answer.ok && live) setItems(answer.data.items);
    };
    void reread();
    const onShow = (e: PageTransitionEvent) => {
      if (e.persisted) void reread();
    };
    window.addEventListener("pageshow", onShow);
    return () => {
      live = false;
      window.removeEventListener("pageshow", onShow);
    };
  }, [boardId, proposalId]);
  return (
    <ReviewItemsPanel
      boardId={boardId}
      items={items}
      answerSections={answerSections}
      onChange={(changed) => setItems((current) => current.map((item) => (item.id === changed.id ? changed : item)))}
    />
  );
}
