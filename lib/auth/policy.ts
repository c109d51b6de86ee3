/**
 * The one authorization policy of VisViva: "may this user do this on this resource?".
 * Every route handler, server action and data-access function asks it, with the facts it
 * loaded about the resource. Pure (no database access) so it is easy to test and to read.
 *
 * Outcomes: "allow"; "forbid" (the caller may know the resource exists: 403); "hide" (the
 * caller is not a member of the resource's board: answer 404 so existence is not leaked).
 */
import { forbidden, notFound } from "@/lib/errors";

export type BoardRole = "proposer" | "reviewer" | "chair";

export interface Actor {
  id: string;
  isAdmin: boolean;
}

/** What the caller is to the resource. Fill in what the permission needs; leave the rest out. */
export interface ResourceFacts {
  /** The caller's active role on the resource's board; null when not an active member. */
  role: BoardRole | null;
  /** The caller owns the proposal or is one of its co-authors. */
  isAuthor?: boolean;
  /** The caller is assigned to review the proposal (this version). */
  isAssigned?: boolean;
  /** The caller declared, or the system found, a conflict with the proposal. */
  isConflicted?: boolean;
  /** The caller wrote the review item, review or note in question. */
  isAuthorOfItem?: boolean;
  /** The caller's own review of the proposal has been submitted. */
  ownReviewSubmitted?: boolean;
  /** The board shares review items among reviewers after they submitted their own. */
  shareItemsAfterSubmit?: boolean;
  /** A decision has been issued on the version in question. */
  decisionIssued?: boolean;
  /** The call's response window has opened (it may have closed since). */
  responseWindowStarted?: boolean;
  /** The call's response window is open now. */
  responseWindowOpen?: boolean;
  /** The review item is released to the proposer: its reviewer submitted their review (or the chair raised it). */
  itemReleased?: boolean;
}

export type Permission =
  | "board.view"
  | "board.manage"
  | "members.view"
  | "members.manage"
  | "call.manage"
  | "proposal.create"
  | "proposal.view"
  | "proposal.edit"
  | "review.assign"
  | "review.view-all"
  | "review.write"
  | "review.reopen"
  | "conflict.declare"
  | "rubric.manage"
  | "review-item.create"
  | "review-item.view"
  | "review-item.reply"
  | "review-item.answer"
  | "review-item.dispose"
  | "decision.make"
  | "decision.view"
  | "report.view"
  | "meeting.view"
  | "meeting.run"
  | "site.admin";

export type Outcome = "allow" | "forbid" | "hide";

type Rule = (actor: Actor, facts: ResourceFacts) => boolean;

const isChair: Rule = (_a, f) => f.role === "chair";
const isMember: Rule = (_a, f) => f.role !== null;

/** The rules, one line each. Admins may do everything a chair may. */
const rules: Record<Permission, Rule> = {
  "board.view": isMember,
  "board.manage": isChair,
  "members.view": isChair,
  "members.manage": isChair,
  "call.manage": isChair,
  "proposal.create": (_a, f) => f.role === "proposer",
  "proposal.view": (_a, f) => f.role === "chair" || f.isAuthor === true || (f.role === "reviewer" && f.isAssigned === true && f.isConflicted !== true),
  "proposal.edit": (_a, f) => f.isAuthor === true,
  "review.assign": isChair,
  "review.view-all": isChair,
  "review.write": (_a, f) => f.role === "reviewer" && f.isAssigned === true && f.isConflicted !== true,
  "review.reopen": isChair,
  "conflict.declare": (_a, f) => f.role === "reviewer",
  "rubric.manage": isChair,
  "review-item.create": (_a, f) => (f.role === "reviewer" && f.isAssigned === true && f.isConflicted !== true) || f.role === "chair",
  "review-item.view": (_a, f) =>
    f.role === "chair" ||
    f.isAuthorOfItem === true ||
    (f.isAuthor === true && f.decisionIssued === true) ||
    (f.isAuthor === true && f.responseWindowStarted === true && f.itemReleased === true) ||
    (f.role === "reviewer" && f.isAssigned === true && f.isConflicted !== true && f.shareItemsAfterSubmit === true && f.ownReviewSubmitted === true),
  "review-item.reply": (_a, f) =>
    f.role === "chair" ||
    f.isAuthorOfItem === true ||
    (f.isAuthor === true && f.decisionIssued === true) ||
    (f.isAuthor === true && f.responseWindowOpen === true && f.itemReleased === true) ||
    (f.role === "reviewer" && f.isAssigned === true && f.isConflicted !== true),
  "review-item.answer": (_a, f) => f.isAuthor === true && f.responseWindowOpen === true && f.itemReleased === true,
  "review-item.dispose": (_a, f) => f.role === "chair" || (f.role === "reviewer" && f.isAuthorOfItem === true),
  "decision.make": isChair,
  "decision.view": (_a, f) => f.role === "chair" || (f.isAuthor === true && f.decisionIssued === true),
  // The review report of a version: the chair; its authors once that version is decided; its
  // reviewers when the board shares review items after submission and theirs is submitted.
  "report.view": (_a, f) =>
    f.role === "chair" ||
    (f.isAuthor === true && f.decisionIssued === true) ||
    (f.role === "reviewer" && f.isAssigned === true && f.isConflicted !== true && f.shareItemsAfterSubmit === true && f.ownReviewSubmitted === true),
  // The panel meeting: the chair and the board's reviewers follow it; only the chair runs it.
  "meeting.view": (_a, f) => f.role === "chair" || f.role === "reviewer",
  "meeting.run": isChair,
  "site.admin": () => false,
};

/** Permissions whose resources are only visible to the people the rule lets in (others get 404). */
const hiddenUnlessAllowed = new Set<Permission>(["proposal.view", "proposal.edit", "decision.view", "review-item.view", "report.view"]);

export function decide(actor: Actor, permission: Permission, facts: ResourceFacts): Outcome {
  if (actor.isAdmin) return "allow";
  if (permission === "site.admin") return "forbid";
  if (facts.role === null && !facts.isAuthor) return "hide";
  if (rules[permission](actor, facts)) return "allow";
  return hiddenUnlessAllowed.has(permission) ? "hide" : "forbid";
}

/** Throws a 404 or 403 AppError unless the policy allows. */
export function authorize(actor: Actor, permission: Permission, facts: ResourceFacts, what = "That resource"): void {
  const outcome = decide(actor, permission, facts);
  if (outcome === "hide") throw notFound(what);
  if (outcome === "forbid") throw forbidden();
}

export function can(actor: Actor, permission: Permission, facts: ResourceFacts): boolean {
  return decide(actor, permission, facts) === "allow";
}

export const permissions = Object.keys(rules) as Permission[];
