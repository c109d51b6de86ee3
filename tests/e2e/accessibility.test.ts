// axe-core over the pages the story test does not reach: sign-in and its helpers, the public
// orbit-check page, boards, account, members, settings, calls, proposals, conflicts, the
// reviewer queue and the admin tables. No serious or critical violations anywhere.
import { describe, expect, it } from "vitest";
import { saveCallRubric } from "@/lib/dal/rubrics";
import { browserSession } from "../support/browser";
import { describeViolations, seriousViolations } from "../support/axe";
import { asSessionUser, createBoardWithCast } from "../support/factories";
import { makeCall } from "../integration/matrix/dossiers";
import { rubricInput } from "../integration/review-fixtures";

describe("accessibility of the remaining screens", () => {
  const { page: openPage, as } = browserSession();

  it("has no serious or critical axe violations on any of them", async () => {
    const cast = await createBoardWithCast();
    const call = await makeCall(cast, { requiredSections: ["Mission design"] });
    await saveCallRubric(asSessionUser(cast.chair), cast.board.id, call.id, rubricInput);
    const board = `/boards/${cast.board.id}`;
    const findings: string[] = [];
    const check = async (page: Awaited<ReturnType<typeof openPage>>, path: string) => {
      const response = await page.goto(path);
      expect(response?.status(), path).toBeLessThan(400);
      await page.waitForLoadState("networkidle");
      const violations = await seriousViolations(page);
      if (violations.length > 0) findings.push(describeViolations(path, violations));
    };

    const visitor = await openPage();
    for (const path of ["/", "/sign-in", "/sign-in/reset", "/tools/orbit-check", "/sign-in/link?token=unused-token-for-the-page"]) await check(visitor, path);

    const chair = await as(cast.chair.email);
    for (const path of [
      "/boards",
      board,
      `${board}/members`,
      `${board}/settings`,
      `${board}/settings/letter`,
      `${board}/calls`,
      `${board}/calls/${call.id}`,
      `${board}/calls/${call.id}/rubric`,
      `${board}/calls/${call.id}/assignments`,
      `${board}/calls/${call.id}/overview`,
      "/account",
    ]) {
      await check(chair, path);
    }
    const proposer = await as(cast.proposer.email);
    for (const path of [`${board}/proposals`]) await check(proposer, path);
    const reviewer = await as(cast.reviewer.email);
    for (const path of [`${board}/reviews`, `${board}/conflicts`]) await check(reviewer, path);
    const admin = await as(cast.admin.email);
    for (const path of ["/admin/audit", "/admin/outbox"]) await check(admin, path);

    expect(findings, findings.join("\n\n")).toEqual([]);
  });
});
