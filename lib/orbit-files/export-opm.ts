/**
 * Export of an orbit-check block's orbit as a CCSDS OPM in KVN (CCSDS 502.0-B-2 section 3):
 * header, metadata, state vector, and the Keplerian elements the state was made from.
 * Blocks that give only a shape (altitudes, semi-major axis and eccentricity, inclination)
 * get the angles they leave open set to 0, said in COMMENT lines.
 */
import { evaluateClaim } from "@/lib/orbit";
import { BODIES, isBodyName } from "@/lib/orbit/constants";
import { elementsToState } from "@/lib/orbit/state-vectors";
import { convertState } from "@/lib/orbit/frames";
import { toUtc, type TimeScale } from "@/lib/orbit/time-scales";

const DEG = Math.PI / 180;

export const OPM_CAUTION =
  "Two-body screening estimate from a dossier's orbit-check block, not flight-qualified analysis; the mission's own flight dynamics, mission assurance and licensing authority govern.";

export interface BlockForExport {
  blockId: string;
  label: string;
  claim: { kind: string; body?: unknown; given: Record<string, unknown>; claimed?: Record<string, unknown> };
}

export type OpmExport = { ok: true; text: string; filename: string } | { ok: false; error: string };

const num = (x: unknown): number | null =>
  typeof x === "number" && Number.isFinite(x) ? x : typeof x === "string" && x.trim() !== "" && Number.isFinite(Number(x)) ? Number(x) : null;

const SHAPE_KEYS = [
  "altitude",
  "periapsisAltitude",
  "apoapsisAltitude",
  "periapsisRadius",
  "apoapsisRadius",
  "semiMajorAxis",
  "eccentricity",
  "semiLatusRectum",
  "period",
];

function kvnText(x: string): string {
  // KVN values are one line of ASCII.
  return (
    x
      .replace(/[^\x20-\x7e]/g, "?")
      .replace(/\s+/g, " ")
      .trim() || "UNNAMED"
  );
}

/** The OPM text for a block, with the epoch given (ISO, UTC) or J2000.0 as a placeholder. */
export function opmForBlock(
  block: BlockForExport,
  options: { epochIso?: string | null; timeSystem?: string; creationDate?: Date; objectId?: string } = {},
): OpmExport {
  const body = typeof block.claim.body === "string" && isBodyName(block.claim.body) ? block.claim.body : block.claim.body === undefined ? "earth" : null;
  if (!body) return { ok: false, error: "blocks with their own body constants cannot be exported; use a body of the constants table" };
  const mu = BODIES[body].mu.value;
  const given = block.claim.given ?? {};
  const claimed = block.claim.claimed ?? {};
  const comments: string[] = [];
  let r: readonly number[];
  let v: readonly number[];
  if (block.claim.kind === "stateVector") {
    const p = given.position;
    const q = given.velocity;
    if (!Array.isArray(p) || !Array.isArray(q) || p.length !== 3 || q.length !== 3 || ![...p, ...q].every((x) => num(x) !== null))
      return { ok: false, error: "the block's position and velocity are not three numbers each" };
    r = p.map((x) => num(x)!);
    v = q.map((x) => num(x)!);
  } else {
    const shape: Record<string, unknown> = {};
    for (const k of SHAPE_KEYS) if (given[k] !== undefined) shape[k] = given[k];
    if (Object.keys(shape).length === 0)
      return { ok: false, error: `a ${block.claim.kind} block does not describe one orbit; only blocks with an orbit shape or a state can be exported` };
    const shapeResult = evaluateClaim({ id: "export", kind: "orbit", body, given: shape });
    const a = num(shapeResult.computed.semiMajorAxis);
    const e = num(shapeResult.computed.eccentricity);
    if (shapeResult.status === "invalid" || a === null || e === null || !(e < 1))
      return { ok: false, error: `the block's orbit cannot be exported: ${shapeResult.messages[0] ?? "it is not a closed orbit"}` };
    const angle = (k: string, from: Record<string, unknown>[]) => {
      for (const src of from) {
        const x = num(src[k]);
        if (x !== null) return x;
      }
      return null;
    };
    let inc = angle("inclination", [given, claimed]);
    if (inc === null && block.claim.kind === "sunSynchronous") {
      const ss = evaluateClaim({ id: "export", kind: "sunSynchronous", body, given: shape });
      inc = num(ss.computed.inclination);
    }
    const raan = angle("raan", [given]);
    const argp = angle("argPeriapsis", [given]);
    const nu = angle("trueAnomaly", [given]);
    const open = [
      inc === null ? "inclination" : null,
      raan === null ? "RAAN" : null,
      argp === null ? "argument of periapsis" : null,
      nu === null ? "true anomaly" : null,
    ].filter(Boolean);
    if (open.length) comments.push(`The block leaves ${open.join(", ")} open; 0 deg is written for them.`);
    const s = elementsToState(a * (1 - e * e), e, (inc ?? 0) * DEG, (raan ?? 0) * DEG, (argp ?? 0) * DEG, (nu ?? 0) * DEG, mu);
    r = s.position;
    v = s.velocity;
  }
  const epoch = options.epochIso ?? null;
  const scale: TimeScale = epoch && options.timeSystem && ["UTC", "TAI", "TT"].includes(options.timeSystem) ? (options.timeSystem as TimeScale) : "UTC";
  // An Earth orbit's angles in a block are read as the text gives them, against Earth's equator at
  // the epoch (as element sets are, TEME); with an epoch they are rotated to EME2000 (lib/orbit/frames.ts).
  const utc = epoch && body === "earth" && block.claim.kind !== "stateVector" ? toUtc(Date.parse(`${epoch.slice(0, 23)}Z`), scale) : null;
  const rotated = utc?.ok ? convertState(r as [number, number, number], v as [number, number, number], "TEME", "EME2000", utc.ms) : null;
  if (rotated?.ok) {
    r = rotated.r;
    v = rotated.v;
    comments.push("The block's angles are against Earth's equator at the epoch; the state is rotated to EME2000 (IAU-76/FK5 reduction).");
  } else comments.push("Orbit-check blocks state no frame; EME2000 is written.");
  if (!epoch) comments.push("The block gives no epoch; J2000.0 (2000-01-01T12:00:00.000) is written as a placeholder.");
  const created = (options.creationDate ?? new Date()).toISOString().slice(0, 23);
  const f = (x: number, d: number) => (Object.is(x, -0) ? 0 : x).toFixed(d);
  const name = kvnText(block.label || `orbit-check ${block.blockId.slice(0, 8)}`);
  const lines = [
    "CCSDS_OPM_VERS = 2.0",
    `COMMENT ${kvnText(OPM_CAUTION)}`,
    ...comments.map((c) => `COMMENT ${kvnText(c)}`),
    `CREATION_DATE = ${created}`,
    "ORIGINATOR = VISVIVA",
    `OBJECT_NAME = ${name}`,
    `OBJECT_ID = ${kvnText(options.objectId ?? `BLOCK-${block.blockId.slice(0, 8)}`)}`,
    `CENTER_NAME = ${body.toUpperCase()}`,
    "REF_FRAME = EME2000",
    `TIME_SYSTEM = ${scale}`,
    `EPOCH = ${epoch ? epoch.slice(0, 23) : "2000-01-01T12:00:00.000"}`,
    `X = ${f(r[0]!, 9)} [km]`,
    `Y = ${f(r[1]!, 9)} [km]`,
    `Z = ${f(r[2]!, 9)} [km]`,
    `X_DOT = ${f(v[0]!, 12)} [km/s]`,
    `Y_DOT = ${f(v[1]!, 12)} [km/s]`,
    `Z_DOT = ${f(v[2]!, 12)} [km/s]`,
    "",
  ];
  const filename = `${
    name
      .replace(/[^A-Za-z0-9._-]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 60) || "orbit"
  }.opm`;
  return { ok: true, text: lines.join("\n"), filename };
}
