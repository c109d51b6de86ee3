/**
 * Resolves a claim's `body` (a table name or an override object) to plain constants.
 */
import { BODY_NAMES, defaultBody, isBodyName, type Body, type BodyName } from "./constants";
import { fail } from "./errors";

const OVERRIDE_KEYS = ["name", "mu", "radius", "j2", "rotationRate", "orbitRadius", "parentMu", "j2ReferenceRadius", "year"] as const;

export function resolveBody(input: unknown, fallback: BodyName, label = "body"): Body {
  if (input === undefined || input === null) return defaultBody(fallback);
  if (typeof input === "string") {
    const key = input.trim().toLowerCase();
    if (isBodyName(key)) return defaultBody(key);
    fail(`${label} "${input}" is not in the constants table; use one of ${BODY_NAMES.join(", ")} or an object with mu (km³/s²) and radius (km)`);
  }
  if (typeof input !== "object" || Array.isArray(input))
    fail(`${label} must be a body name (${BODY_NAMES.join(", ")}) or an object such as { "name": "earth", "mu": 398600, "radius": 6378 }`);
  const o = input as Record<string, unknown>;
  const unknownKeys = Object.keys(o).filter((k) => !(OVERRIDE_KEYS as readonly string[]).includes(k));
  if (unknownKeys.length > 0) fail(`${label} has unknown field(s) ${unknownKeys.join(", ")}; allowed: ${OVERRIDE_KEYS.join(", ")}`);
  let base: Body | undefined;
  if (o.name !== undefined) {
    if (typeof o.name !== "string") fail(`${label}.name must be a text`);
    const key = o.name.trim().toLowerCase();
    if (isBodyName(key)) base = defaultBody(key);
  }
  const num = (k: string, check: (x: number) => boolean, what: string): number | undefined => {
    const v = o[k];
    if (v === undefined) return undefined;
    if (typeof v !== "number" || !Number.isFinite(v) || !check(v)) fail(`${label}.${k} must be ${what} (got ${JSON.stringify(v)})`);
    return v;
  };
  const mu = num("mu", (x) => x > 0, "a positive number in km³/s²");
  const radius = num("radius", (x) => x >= 0, "a number ≥ 0 in km");
  const j2 = num("j2", () => true, "a finite number");
  const rotationRate = num("rotationRate", () => true, "a finite number in rad/s");
  const orbitRadius = num("orbitRadius", (x) => x > 0, "a positive number in km");
  const parentMu = num("parentMu", (x) => x > 0, "a positive number in km³/s²");
  const j2ReferenceRadius = num("j2ReferenceRadius", (x) => x > 0, "a positive number in km");
  const year = num("year", (x) => x > 0, "a positive number of days");
  if (!base && (mu === undefined || radius === undefined))
    fail(`${label} "${String(o.name ?? "unnamed")}" is not in the constants table, so it needs both mu (km³/s²) and radius (km)`);
  const b: Body = base ?? {
    name: typeof o.name === "string" ? o.name : "custom",
    mu: mu!,
    radius: radius!,
    j2: 0,
    j2ReferenceRadius: radius!,
    rotationRate: 0,
  };
  return {
    ...b,
    mu: mu ?? b.mu,
    radius: radius ?? b.radius,
    j2: j2 ?? b.j2,
    // An override that gives a radius but no j2ReferenceRadius pairs its J2 with that radius
    // (handbook examples state one radius for both).
    j2ReferenceRadius: j2ReferenceRadius ?? radius ?? b.j2ReferenceRadius,
    year: year ?? b.year,
    rotationRate: rotationRate ?? b.rotationRate,
    orbitRadius: orbitRadius ?? b.orbitRadius,
    parentMu: parentMu ?? b.parentMu,
  };
}
