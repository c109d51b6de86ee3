import { describe, expect, it } from "vitest";
import { emailDomain, findConflicts, hasHardConflict, sameOrganisation } from "./conflicts";

const owner = { id: "p1", email: "nadia.okafor@lumen-orbital.example.com", organisation: "Lumen Orbital" };
const coauthor = { id: "p2", email: "r.tamsin@kestrel-labs.example.net", organisation: "Kestrel Labs" };
const reviewer = (email: string, organisation: string | null = null) => ({ id: "r1", email, organisation });

describe("conflict rules", () => {
  it("reads e-mail domains without case and organisations without case or extra spaces", () => {
    expect(emailDomain("A.B@Kestrel-Labs.Example.NET")).toBe("kestrel-labs.example.net");
    expect(emailDomain("no-at-sign")).toBe("");
    expect(sameOrganisation("  Lumen   Orbital ", "lumen orbital")).toBe(true);
    expect(sameOrganisation(null, "")).toBe(false);
  });

  it("finds nothing for an unrelated reviewer", () => {
    expect(
      findConflicts({ reviewer: reviewer("ivo@meridian.example.org", "Meridian"), authors: [owner, coauthor], proposalId: "x", declarations: [] }),
    ).toEqual([]);
  });

  it("flags the same e-mail domain as a co-author as likely, not as a conflict", () => {
    const findings = findConflicts({ reviewer: reviewer("ivo@kestrel-labs.example.net"), authors: [owner, coauthor], proposalId: "x", declarations: [] });
    expect(findings).toEqual([{ strength: "likely", rule: "same-email-domain", message: "Same e-mail domain as an author (kestrel-labs.example.net)." }]);
    expect(hasHardConflict(findings)).toBe(false);
  });

  it("makes the same organisation as an author a conflict", () => {
    const findings = findConflicts({
      reviewer: reviewer("ivo@meridian.example.org", "lumen orbital"),
      authors: [owner, coauthor],
      proposalId: "x",
      declarations: [],
    });
    expect(findings.map((f) => f.rule)).toEqual(["same-organisation"]);
    expect(hasHardConflict(findings)).toBe(true);
  });

  it("honours a declaration on this proposal and ignores one on another proposal", () => {
    const declarations = [
      { proposalId: "x", organisation: null, reason: "Former supervisor of the lead author" },
      { proposalId: "y", organisation: null, reason: "Unrelated" },
    ];
    const findings = findConflicts({ reviewer: reviewer("ivo@meridian.example.org"), authors: [owner], proposalId: "x", declarations });
    expect(findings).toEqual([{ strength: "conflict", rule: "declared-proposal", message: "Declared by the reviewer: Former supervisor of the lead author" }]);
  });

  it("applies an organisation declaration to every proposal with an author from that organisation", () => {
    const declarations = [{ proposalId: null, organisation: "Kestrel Labs ", reason: "Consulting contract" }];
    const withKestrel = findConflicts({ reviewer: reviewer("ivo@meridian.example.org"), authors: [owner, coauthor], proposalId: "x", declarations });
    const withoutKestrel = findConflicts({ reviewer: reviewer("ivo@meridian.example.org"), authors: [owner], proposalId: "z", declarations });
    expect(withKestrel.map((f) => f.rule)).toEqual(["declared-organisation"]);
    expect(withoutKestrel).toEqual([]);
  });

  it("never lets an author review their own proposal", () => {
    const findings = findConflicts({ reviewer: { ...coauthor }, authors: [owner, coauthor], proposalId: "x", declarations: [] });
    expect(hasHardConflict(findings)).toBe(true);
  });
});
