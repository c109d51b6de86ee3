/**
 * Helpers shared by the budget kinds (lifetime, disposal, massBudget, deltaVBudget phases).
 * Only type imports from ./types, so these files load in any order.
 */
import { SOLAR_ACTIVITIES, type SolarActivity } from "../atmosphere";
import { conicFromShape, type Conic, type ShapeInput } from "../conics";
import type { Body } from "../constants";
import { fail, fmt } from "../errors";
import type { Evaluation, GivenInfo, Inputs } from "./types";
import type { ComputedValue } from "../schema";

export const SHAPE_FIELDS = [
  "altitude",
  "periapsisAltitude",
  "apoapsisAltitude",
  "periapsisRadius",
  "apoapsisRadius",
  "semiMajorAxis",
  "eccentricity",
  "semiLatusRectum",
  "period",
] as const;

export const SHAPE_GIVEN_CHOICES: [string, GivenInfo["use"]][] = SHAPE_FIELDS.map((n) => [n, "choice"]);

export const DRAG_GIVEN: [string, GivenInfo["use"]][] = [
  ["mass", "choice"],
  ["dragArea", "choice"],
  ["dragCoefficient", "choice"],
  ["ballisticCoefficient", "choice"],
  ["solarActivity", "optional"],
];

export const DRAG_RULE = "mass (kg), dragArea (m²) and dragCoefficient, or ballisticCoefficient (kg/m²); solarActivity low, mean (default) or high";

export function evaluation(values: Record<string, ComputedValue>, body: Body, messages: string[] = []): Evaluation {
  return { values, unavailable: {}, messages, conics: [], plotBodyRadius: body.radius };
}

/** A closed orbit from `altitude` (circular) or exactly two shape values. */
export function readClosedOrbit(g: Inputs, body: Body): Conic {
  const present = SHAPE_FIELDS.filter((n) => g.has(n));
  if (present.length === 0) fail("give the orbit: altitude (circular), or two of periapsisAltitude, apoapsisAltitude, semiMajorAxis, eccentricity…");
  let c: Conic;
  if (present.includes("altitude")) {
    if (present.length > 1) fail("altitude describes a circular orbit by itself; for an elliptic orbit give periapsisAltitude and apoapsisAltitude");
    const r = body.radius + g.num("altitude");
    c = { a: r, e: 0, p: r };
  } else {
    if (present.length !== 2) fail(`give exactly two orbit shape values (got ${present.length}: ${present.join(", ")})`);
    const s: ShapeInput = {};
    if (g.has("periapsisAltitude")) s.periapsisRadius = body.radius + g.num("periapsisAltitude");
    if (g.has("periapsisRadius")) s.periapsisRadius = g.num("periapsisRadius");
    if (g.has("apoapsisAltitude")) s.apoapsisRadius = body.radius + g.num("apoapsisAltitude");
    if (g.has("apoapsisRadius")) s.apoapsisRadius = g.num("apoapsisRadius");
    if (g.has("semiMajorAxis")) s.semiMajorAxis = g.num("semiMajorAxis");
    if (g.has("eccentricity")) s.eccentricity = g.num("eccentricity", "nonNegative");
    if (g.has("semiLatusRectum")) s.semiLatusRectum = g.num("semiLatusRectum");
    if (g.has("period")) s.period = g.num("period");
    c = conicFromShape(s, body.mu);
  }
  if (!(c.e < 1) || !(c.a > 0)) fail(`drag decay needs a closed orbit (e < 1); this one has e = ${fmt(c.e)}`);
  if (c.a * (1 - c.e) <= body.radius) fail(`the perigee is below the surface of ${body.name}; raise it`);
  return c;
}

/** The ballistic coefficient m/(Cd·A) in kg/m², from the drag inputs. */
export function readBallisticCoefficient(g: Inputs): number {
  if (g.has("ballisticCoefficient")) {
    if (g.has("dragArea") || g.has("dragCoefficient")) fail("give ballisticCoefficient, or dragArea with dragCoefficient (and mass), not both");
    const B = g.num("ballisticCoefficient");
    if (!(B > 0)) fail(`given.ballisticCoefficient must be more than 0 kg/m² (got ${fmt(B)}): a spacecraft with no mass per drag area cannot be modelled`);
    return B;
  }
  if (!g.has("mass") || !g.has("dragArea") || !g.has("dragCoefficient")) fail(`give the drag inputs: ${DRAG_RULE}`);
  const m = g.num("mass", "positive");
  const A = g.num("dragArea", "positive");
  const cd = g.num("dragCoefficient", "positive");
  // Ballistic coefficient B = m/(Cd·A): Vallado, "Fundamentals of Astrodynamics and Applications" (4th ed.), ch. 9, atmospheric drag (recalled from memory).
  return m / (cd * A);
}

export function readSolarActivity(g: Inputs): SolarActivity {
  return g.text("solarActivity", SOLAR_ACTIVITIES, "mean") as SolarActivity;
}

/** Only Earth's atmosphere is tabulated. */
export function requireEarth(body: Body, kind: string): void {
  if (body.name !== "earth") fail(`${kind} uses a density model of Earth's atmosphere; the body must be earth (got ${body.name})`);
}

/** Reads an array given of objects, with a readable message for anything else. */
export function objectArray(g: Inputs, name: string, example: string, max = 500): Record<string, unknown>[] {
  const raw = g.value(name);
  if (raw === undefined || raw === null) fail(`given.${name} is required, e.g. ${example}`);
  if (!Array.isArray(raw)) fail(`given.${name} must be an array such as ${example}`);
  if (raw.length > max) fail(`given.${name} has more than ${max} entries`);
  return raw.map((m, i) => {
    if (typeof m !== "object" || m === null || Array.isArray(m)) fail(`${name}[${i}] must be an object such as ${example.replace(/^\[|\]$/g, "")}`);
    return m as Record<string, unknown>;
  });
}

export function fieldNumber(o: Record<string, unknown>, path: string, field: string, unit: string, rule: "any" | "nonNegative" | "positive" = "any"): number {
  const v = o[field];
  if (typeof v !== "number" || !Number.isFinite(v)) fail(`${path}.${field} must be a finite number in ${unit}`);
  if (rule === "nonNegative" && v < 0) fail(`${path}.${field} cannot be negative (got ${fmt(v)} ${unit})`);
  if (rule === "positive" && !(v > 0)) fail(`${path}.${field} must be more than 0 ${unit} (got ${fmt(v)})`);
  return v;
}
