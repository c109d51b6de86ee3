/**
 * The product's vocabulary, defined once: every database enum, type, zod enum and label map
 * derives from these arrays. No imports, so any layer (client components included) may use it;
 * ESLint lets every file import `@/db/vocabulary` while the rest of `@/db` stays in lib/dal.
 */

/** A member's role on a board. */
export const boardRoles = ["proposer", "reviewer", "chair"] as const;
export type BoardRole = (typeof boardRoles)[number];

/** Where a proposal stands. */
export const proposalStatuses = ["draft", "submitted", "in_review", "decided", "withdrawn"] as const;
export type ProposalStatus = (typeof proposalStatuses)[number];

/** The verdict of one stored orbit check (contract version 2's claim status). */
export const checkStatuses = ["consistent", "inconsistent", "invalid"] as const;
export type CheckStatus = (typeof checkStatuses)[number];

/** The chair's decision on a version. */
export const decisionOutcomes = ["accept", "revise", "decline"] as const;
export type DecisionOutcome = (typeof decisionOutcomes)[number];

/** Where an outbox e-mail stands. */
export const outboxStatuses = ["queued", "sending", "sent", "failed"] as const;
export type OutboxStatus = (typeof outboxStatuses)[number];
