// The board home shows proposers their own dossiers with status, and nobody else's.
import { beforeAll, describe, expect, it } from "vitest";
import { appUrl } from "../support/app";
import { signedIn } from "../support/http";
import { makeProposal } from "./matrix/dossiers";

describe("the board home", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("lists a proposer's dossiers with their status; reviewers see no such section", async () => {
    const { cast, proposal } = await makeProposal();
    const path = `/boards/${cast.board.id}`;
    const asProposer = await (await (await signedIn(cast.proposer.email)).get(path)).text();
    expect(asProposer).toContain("Your dossiers");
    expect(asProposer).toContain(proposal.title);
    expect(asProposer).toContain("Draft");
    const asReviewer = await (await (await signedIn(cast.reviewer.email)).get(path)).text();
    expect(asReviewer).not.toContain("Your dossiers");
    expect(asReviewer).not.toContain(proposal.title);
  });
});
