import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors";
import { authorize, decide, permissions } from "./policy";

const member = { id: "u1", isAdmin: false };
const admin = { id: "a1", isAdmin: true };

describe("the authorization policy", () => {
  it("hides every board resource from non-members (404, existence not leaked)", () => {
    for (const permission of permissions.filter((p) => p !== "site.admin")) {
      expect(decide(member, permission, { role: null })).toBe("hide");
    }
  });

  it("lets admins do everything, and nobody else use site administration", () => {
    for (const permission of permissions) expect(decide(admin, permission, { role: null })).toBe("allow");
    expect(decide(member, "site.admin", { role: "chair" })).toBe("forbid");
  });

  it("keeps chair-only work with chairs", () => {
    for (const permission of ["members.manage", "review.assign", "decision.make", "rubric.manage", "call.manage"] as const) {
      expect(decide(member, permission, { role: "chair" })).toBe("allow");
      expect(decide(member, permission, { role: "reviewer" })).toBe("forbid");
      expect(decide(member, permission, { role: "proposer" })).toBe("forbid");
    }
  });

  it("lets a reviewer see a proposal only when assigned and free of conflicts", () => {
    expect(decide(member, "proposal.view", { role: "reviewer", isAssigned: true })).toBe("allow");
    expect(decide(member, "proposal.view", { role: "reviewer", isAssigned: true, isConflicted: true })).toBe("hide");
    expect(decide(member, "proposal.view", { role: "reviewer", isAssigned: false })).toBe("hide");
    expect(decide(member, "review.write", { role: "reviewer", isAssigned: true, isConflicted: true })).toBe("forbid");
  });

  it("shows proposers their review items and decision only once the decision is issued", () => {
    expect(decide(member, "decision.view", { role: "proposer", isAuthor: true, decisionIssued: false })).toBe("hide");
    expect(decide(member, "decision.view", { role: "proposer", isAuthor: true, decisionIssued: true })).toBe("allow");
    expect(decide(member, "review-item.view", { role: "proposer", isAuthor: true, decisionIssued: true })).toBe("allow");
  });

  it("shares review items between reviewers only after their own review is submitted, where the board allows", () => {
    const facts = { role: "reviewer" as const, isAssigned: true, shareItemsAfterSubmit: true };
    expect(decide(member, "review-item.view", { ...facts, ownReviewSubmitted: false })).toBe("hide");
    expect(decide(member, "review-item.view", { ...facts, ownReviewSubmitted: true })).toBe("allow");
    expect(decide(member, "review-item.view", { ...facts, ownReviewSubmitted: true, shareItemsAfterSubmit: false })).toBe("hide");
  });

  it("opens a version's review report to the chair, to its authors once decided, and to its reviewers only under the board's sharing rule", () => {
    expect(decide(member, "report.view", { role: "chair" })).toBe("allow");
    expect(decide(member, "report.view", { role: "proposer", isAuthor: true, decisionIssued: false })).toBe("hide");
    expect(decide(member, "report.view", { role: "proposer", isAuthor: true, decisionIssued: true })).toBe("allow");
    expect(decide(member, "report.view", { role: "proposer", isAuthor: false, decisionIssued: true })).toBe("hide");
    const reviewer = { role: "reviewer" as const, isAssigned: true, shareItemsAfterSubmit: true, ownReviewSubmitted: true };
    expect(decide(member, "report.view", reviewer)).toBe("allow");
    expect(decide(member, "report.view", { ...reviewer, ownReviewSubmitted: false })).toBe("hide");
    expect(decide(member, "report.view", { ...reviewer, shareItemsAfterSubmit: false })).toBe("hide");
    expect(decide(member, "report.view", { ...reviewer, isConflicted: true })).toBe("hide");
    expect(decide(member, "report.view", { ...reviewer, isAssigned: false })).toBe("hide");
  });

  it("throws AppErrors with 404 and 403", () => {
    const thrown = (run: () => unknown): AppError => {
      try {
        run();
      } catch (error) {
        return error as AppError;
      }
      throw new Error("expected an AppError, but nothing was thrown");
    };
    const forbidden = thrown(() => authorize(member, "members.manage", { role: "proposer" }));
    expect(forbidden).toBeInstanceOf(AppError);
    expect(forbidden.status).toBe(403);
    const hidden = thrown(() => authorize(member, "board.view", { role: null }, "That board"));
    expect(hidden).toBeInstanceOf(AppError);
    expect(hidden.status).toBe(404);
    expect(hidden.message).toBe("That board was not found.");
  });
});

describe("response round", () => {
  const member = { id: "u", isAdmin: false };
  it("shows released items to the proposal's authors once the window has opened, and lets them answer only while it is open", () => {
    const author = { role: "proposer" as const, isAuthor: true };
    expect(decide(member, "review-item.view", { ...author, responseWindowStarted: true, itemReleased: true })).toBe("allow");
    expect(decide(member, "review-item.view", { ...author, responseWindowStarted: true, itemReleased: false })).toBe("hide");
    expect(decide(member, "review-item.view", { ...author, responseWindowStarted: false, itemReleased: true })).toBe("hide");
    expect(decide(member, "review-item.answer", { ...author, responseWindowOpen: true, itemReleased: true })).toBe("allow");
    expect(decide(member, "review-item.answer", { ...author, responseWindowOpen: false, itemReleased: true })).toBe("forbid");
    expect(decide(member, "review-item.answer", { role: "proposer", isAuthor: false, responseWindowOpen: true, itemReleased: true })).toBe("forbid");
    expect(decide(member, "review-item.answer", { role: "chair", responseWindowOpen: true, itemReleased: true })).toBe("forbid");
    // They may discuss in the item's thread while the window is open, not before.
    expect(decide(member, "review-item.reply", { ...author, responseWindowOpen: true, itemReleased: true })).toBe("allow");
    expect(decide(member, "review-item.reply", { ...author, responseWindowOpen: false, itemReleased: true })).toBe("forbid");
  });

  it("lets the item's reviewer or the chair record a disposition, nobody else", () => {
    expect(decide(member, "review-item.dispose", { role: "reviewer", isAuthorOfItem: true })).toBe("allow");
    expect(decide(member, "review-item.dispose", { role: "reviewer", isAuthorOfItem: false })).toBe("forbid");
    expect(decide(member, "review-item.dispose", { role: "chair" })).toBe("allow");
    expect(decide(member, "review-item.dispose", { role: "proposer", isAuthor: true })).toBe("forbid");
  });
});
