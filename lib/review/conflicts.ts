/**
 * Conflict-of-interest rules. Pure: the data-access layer loads the people and declarations
 * and asks these functions. Two strengths:
 * - a conflict (declared on the proposal, declared with an organisation an author belongs to,
 *   or the same organisation as an author on record): the reviewer can neither be assigned
 *   nor open the proposal;
 * - a likely conflict (the same e-mail domain as an author): shown to the chair, who must
 *   confirm explicitly before assigning (large agencies share one domain).
 */

export interface Person {
  id: string;
  email: string;
  name?: string;
  organisation: string | null;
}

export interface Declaration {
  proposalId: string | null;
  organisation: string | null;
  reason: string;
}

export interface ConflictFinding {
  strength: "conflict" | "likely";
  rule: "declared-proposal" | "declared-organisation" | "same-organisation" | "same-email-domain";
  message: string;
}

/** The part after the last @, lower-cased; empty for a malformed address. */
export function emailDomain(email: string): string {
  const at = email.lastIndexOf("@");
  return at < 0
    ? ""
    : email
        .slice(at + 1)
        .trim()
        .toLowerCase();
}

/** Organisation names compared without case, surrounding or doubled spaces. */
export function sameOrganisation(a: string | null | undefined, b: string | null | undefined): boolean {
  const norm = (s: string | null | undefined) => (s ?? "").trim().replace(/\s+/g, " ").toLowerCase();
  return norm(a) !== "" && norm(a) === norm(b);
}

export function findConflicts(input: { reviewer: Person; authors: Person[]; proposalId: string; declarations: Declaration[] }): ConflictFinding[] {
  const { reviewer, authors, proposalId, declarations } = input;
  const findings: ConflictFinding[] = [];
  for (const d of declarations) {
    if (d.proposalId === proposalId) findings.push({ strength: "conflict", rule: "declared-proposal", message: `Declared by the reviewer: ${d.reason}` });
    if (d.proposalId === null && d.organisation) {
      const author = authors.find((a) => sameOrganisation(a.organisation, d.organisation));
      if (author)
        findings.push({ strength: "conflict", rule: "declared-organisation", message: `Declared conflict with ${d.organisation.trim()}: ${d.reason}` });
    }
  }
  if (authors.some((a) => a.id === reviewer.id))
    findings.push({ strength: "conflict", rule: "same-organisation", message: "The reviewer is an author of this proposal." });
  const orgMate = authors.find((a) => a.id !== reviewer.id && sameOrganisation(a.organisation, reviewer.organisation));
  if (orgMate)
    findings.push({ strength: "conflict", rule: "same-organisation", message: `Same organisation as an author (${reviewer.organisation!.trim()}).` });
  const domain = emailDomain(reviewer.email);
  if (domain && authors.some((a) => a.id !== reviewer.id && emailDomain(a.email) === domain))
    findings.push({ strength: "likely", rule: "same-email-domain", message: `Same e-mail domain as an author (${domain}).` });
  return findings;
}

export function hasHardConflict(findings: ConflictFinding[]): boolean {
  return findings.some((f) => f.strength === "conflict");
}
