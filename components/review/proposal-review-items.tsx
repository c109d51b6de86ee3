"use client";
// The review items the viewer may see on a proposal page (proposers: once the decision is
// issued; reviewers' names are already replaced by the server). Replies go through the API.
import { useState } from "react";
import type { ReviewItemView } from "@/lib/dal/review-items";
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
  return (
    <ReviewItemsPanel
      boardId={boardId}
      items={items}
      answerSections={answerSections}
      onChange={(changed) => setItems((current) => current.map((item) => (item.id === changed.id ? changed : item)))}
    />
  );
}
