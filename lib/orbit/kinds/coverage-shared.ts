/**
 * What the coverage kinds (contactTime, linkBudget, repeatGroundTrack) share: their
 * definition shape, the orbit they read and the stations list. Type-only imports from
 * ./types keep the registry free of an import cycle.
 */
import type { Body } from "../constants";
import { conicFromShape, periapsisRadius, type ShapeInput } from "../conics";
import type { ContactOrbit, Station } from "../contact";
import { validateStation } from "../contact";
import { fail, fmt } from "../errors";
import type { Evaluation, GivenInfo, Inputs } from "./types";
import type { ComputedValue } from "../schema";
import { SHAPE_FIELDS } from "./shared";

export interface CoverageKindDef {
  summary: string;
  givenRule: string;
  given: [string, GivenInfo["use"]][];
  computed: string[];
  usesBody?: false;
  evaluate(g: Inputs, body: Body): Evaluation;
}

export const DEG = Math.PI / 180;

export function evaluation(values: Record<string, ComputedValue>, body: Body, extra: Partial<Omit<Evaluation, "values">> = {}): Evaluation {
  return {
    values,
    unavailable: extra.unavailable ?? {},
    messages: extra.messages ?? [],
    conics: extra.conics ?? [],
    plotBodyRadius: extra.plotBodyRadius ?? body.radius,
  };
}

export const ORBIT_SHAPE_NAMES = SHAPE_FIELDS;

const SHAPE_RULE =
  "altitude (circular), or two of periapsisAltitude, apoapsisAltitude, periapsisRadius, apoapsisRadius, semiMajorAxis, eccentricity, semiLatusRectum, period";

/** A closed orbit's size and shape from the contract's shape values. */
export function readClosedShape(g: Inputs, body: Body): { a: number; e: number } {
  const present = ORBIT_SHAPE_NAMES.filter((n) => g.has(n));
  if (present.length === 0) fail(`give the orbit: ${SHAPE_RULE}`);
  if (present.includes("altitude")) {
    if (present.length > 1) fail(`altitude describes a circular orbit by itself; do not combine it with ${present.filter((n) => n !== "altitude").join(", ")}`);
    const h = g.num("altitude");
    if (!(h > 0)) fail(`given.altitude must be above the surface (got ${fmt(h)} km)`);
    return { a: body.radius + h, e: 0 };
  }
  if (present.length !== 2) fail(`give exactly two shape values (got ${present.join(", ")}): ${SHAPE_RULE}`);
  const s: ShapeInput = {};
  if (g.has("periapsisAltitude")) s.periapsisRadius = body.radius + g.num("periapsisAltitude");
  if (g.has("periapsisRadius")) s.periapsisRadius = g.num("periapsisRadius");
  if (g.has("apoapsisAltitude")) s.apoapsisRadius = body.radius + g.num("apoapsisAltitude");
  if (g.has("apoapsisRadius")) s.apoapsisRadius = g.num("apoapsisRadius");
  if (g.has("semiMajorAxis")) s.semiMajorAxis = g.num("semiMajorAxis");
  if (g.has("eccentricity")) s.eccentricity = g.num("eccentricity", "nonNegative");
  if (g.has("semiLatusRectum")) s.semiLatusRectum = g.num("semiLatusRectum");
  if (g.has("period")) s.period = g.num("period", "positive");
  const c = conicFromShape(s, body.mu);
  if (!(c.e < 1) || !(c.a > 0)) fail(`this kind needs a closed orbit (e < 1); got e = ${fmt(c.e)}`);
  const rp = periapsisRadius(c);
  if (rp < body.radius) fail(`the periapsis (radius ${fmt(rp)} km) is below the surface of ${body.name} (radius ${fmt(body.radius)} km); raise it`);
  return { a: c.a, e: c.e };
}

/** The orbit with its orientation at time zero (angles default to 0). */
export function readContactOrbit(g: Inputs, body: Body): ContactOrbit {
  const { a, e } = readClosedShape(g, body);
  const i = g.num("inclination");
  if (!(i >= 0 && i <= 180)) fail(`given.inclination must be between 0 and 180° (got ${fmt(i)}°)`);
  return {
    a,
    e,
    i: i * DEG,
    raan: (g.optNum("raan") ?? 0) * DEG,
    argPeriapsis: (g.optNum("argPeriapsis") ?? 0) * DEG,
    trueAnomaly: (g.optNum("trueAnomaly") ?? 0) * DEG,
  };
}

export const MAX_STATIONS = 10;

/** Reads given.stations: an array of { name, latitude, longitude, altitude?, minimumElevation }. */
export function readStations(g: Inputs): Station[] {
  if (!g.has("stations")) fail('give stations: an array such as [{ "name": "North site", "latitude": 64.8, "longitude": -147.7, "minimumElevation": 10 }]');
  const raw = g.value("stations");
  if (!Array.isArray(raw) || raw.length === 0) fail("given.stations must be a non-empty array of stations");
  if (raw.length > MAX_STATIONS) fail(`at most ${MAX_STATIONS} stations per claim (got ${raw.length})`);
  return raw.map((s, k) => {
    const label = `station ${k + 1}`;
    if (typeof s !== "object" || s === null || Array.isArray(s)) fail(`${label} must be an object with name, latitude, longitude and minimumElevation`);
    const o = s as Record<string, unknown>;
    const known = ["name", "latitude", "longitude", "altitude", "minimumElevation"];
    const extra = Object.keys(o).filter((x) => !known.includes(x));
    if (extra.length > 0) fail(`${label} has unknown field(s) ${extra.slice(0, 5).join(", ")}; allowed: ${known.join(", ")}`);
    const name = typeof o.name === "string" && o.name.trim() !== "" ? o.name.trim().slice(0, 80) : label;
    const num = (key: string, unit: string, fallback?: number): number => {
      const v = o[key];
      if (v === undefined || v === null) {
        if (fallback !== undefined) return fallback;
        fail(`${name}: ${key} is missing (${unit})`);
      }
      if (typeof v !== "number" || !Number.isFinite(v)) fail(`${name}: ${key} must be a finite number in ${unit}`);
      return v;
    };
    const st: Station = {
      name,
      latitude: num("latitude", "deg"),
      longitude: num("longitude", "deg"),
      altitude: num("altitude", "km", 0),
      minimumElevation: num("minimumElevation", "deg"),
    };
    validateStation(st, name);
    return st;
  });
}
