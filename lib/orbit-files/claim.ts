/**
 * "Make a claim from this file": an orbit-check block whose given values come from a parsed
 * orbit file (mean elements for element sets and SGP4 OMMs, osculating elements of the state
 * otherwise), linked to the attachment by id and SHA-256.
 */
import type { OrbitFileSource } from "./compare";
import type { OrbitSummary } from "./summary";

export interface ClaimFromFile {
  label: string;
  claim: { kind: "j2Rates"; body: "earth"; given: Record<string, number>; claimed: Record<string, number> };
  source: OrbitFileSource;
}

const round = (x: number, d: number) => Number(x.toFixed(d));

/** The block for one orbit of a file, or an explanation why there is none. */
export function claimFromSummary(file: { attachmentId: string; sha256: string; filename: string }, summary: OrbitSummary): ClaimFromFile | { error: string } {
  if (summary.center !== "EARTH") return { error: `claims are made from Earth orbits; this one is about ${summary.center}` };
  const els = summary.basis === "state vector" ? summary.osculating : summary.mean;
  if (!els || !(els.semiMajorAxisKm > 0) || !(els.eccentricity < 1)) return { error: "the file gives no closed orbit to make a claim from" };
  return {
    label: summary.label.replace(/ \(catalogue \d+\)$/, "").slice(0, 80),
    claim: {
      kind: "j2Rates",
      body: "earth",
      given: { semiMajorAxis: round(els.semiMajorAxisKm, 3), eccentricity: round(els.eccentricity, 7), inclination: round(els.inclinationDeg, 4) },
      claimed: {},
    },
    source: { attachmentId: file.attachmentId, sha256: file.sha256, filename: file.filename, index: summary.index },
  };
}
