/**
 * Counts the orbit claims of a version from its stored check results. A block can state
 * several claimed values (a period and an apoapsis, say); each claimed value is one claim.
 * The letter and the decision page count claims, not blocks. Pure.
 */
export interface StoredCheck {
  status: "consistent" | "inconsistent" | "invalid";
  claim: unknown;
  result: unknown;
}

export interface ClaimCounts {
  /** Orbit-check blocks. */
  blocks: number;
  /** Claimed values across all blocks. */
  claims: number;
  /** Claims found inconsistent or that could not be evaluated. */
  flagged: number;
  inconsistent: number;
  invalid: number;
}

const record = (v: unknown): Record<string, unknown> => (v && typeof v === "object" && !Array.isArray(v) ? (v as Record<string, unknown>) : {});

export function countClaims(checks: readonly StoredCheck[]): ClaimCounts {
  const out: ClaimCounts = { blocks: checks.length, claims: 0, flagged: 0, inconsistent: 0, invalid: 0 };
  for (const c of checks) {
    const entries = Array.isArray(record(c.result).checks) ? (record(c.result).checks as unknown[]).map(record) : [];
    if (c.status !== "invalid" && entries.length > 0) {
      out.claims += entries.length;
      const bad = entries.filter((e) => e.ok !== true).length;
      out.flagged += bad;
      out.inconsistent += bad;
      continue;
    }
    // A block that could not be evaluated: each value it claims is one claim not confirmed.
    const claimed = Object.keys(record(record(c.claim).claimed)).length || 1;
    out.claims += claimed;
    if (c.status === "invalid") {
      out.flagged += claimed;
      out.invalid += claimed;
    } else if (c.status === "inconsistent") {
      out.flagged += claimed;
      out.inconsistent += claimed;
    }
  }
  return out;
}
