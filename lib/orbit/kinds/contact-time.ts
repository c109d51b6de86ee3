/**
 * contactTime: passes and daily contact of an orbit over one or more ground stations,
 * over a span of days (default 7, at most 30). Method in lib/orbit/contact.ts.
 */
import type { Body } from "../constants";
import { contactStatistics, stationPasses, unionOfPasses, type Pass } from "../contact";
import { fail, fmt } from "../errors";
import type { Inputs } from "./types";
import type { ComputedValue } from "../schema";
import { evaluation, ORBIT_SHAPE_NAMES, readClosedShape, readContactOrbit, readStations, type CoverageKindDef } from "./coverage-shared";

export const DEFAULT_CONTACT_DAYS = 7;
export const MAX_CONTACT_DAYS = 30;

export interface ContactResult {
  passes: Pass[];
  days: number;
  values: Record<string, ComputedValue>;
  unavailable: Record<string, string>;
  messages: string[];
}

/** Runs the contact search for a claim's givens (throws OrbitInputError on bad input). */
export function contactFromInputs(g: Inputs, body: Body): ContactResult {
  const orbit = readContactOrbit(g, body);
  const stations = readStations(g);
  const days = g.optNum("days") ?? DEFAULT_CONTACT_DAYS;
  if (!(days >= 1 && days <= MAX_CONTACT_DAYS) || !Number.isInteger(days))
    fail(`given.days must be a whole number of days from 1 to ${MAX_CONTACT_DAYS} (got ${fmt(days)}); longer spans are not searched`);
  const dataRate = g.optNum("dataRate");
  if (dataRate !== undefined && !(dataRate > 0)) fail(`given.dataRate must be positive (got ${fmt(dataRate)} bit/s)`);
  const span = days * 86_400;
  const passes = stations.flatMap((s) => stationPasses(body, orbit, s, span)).sort((x, y) => x.rise - y.rise);
  const stats = contactStatistics(unionOfPasses(passes), days);
  const values: Record<string, ComputedValue> = {
    passesPerDay: stats.passesPerDay,
    passesPerDayMin: stats.passesPerDayMin,
    passesPerDayMax: stats.passesPerDayMax,
    contactPerDay: stats.contactPerDay,
    contactPerDayMin: stats.contactPerDayMin,
    longestGap: stats.longestGap,
  };
  const unavailable: Record<string, string> = {};
  const messages: string[] = [];
  if (stats.longestPass !== undefined && stats.shortestPass !== undefined) {
    values.longestPass = stats.longestPass;
    values.shortestPass = stats.shortestPass;
  } else {
    unavailable.longestPass = unavailable.shortestPass = `no pass over the station(s) in ${days} days`;
    messages.push(`no contact at all in ${days} days: check the stations' positions, their minimum elevation and the inclination`);
  }
  if (dataRate !== undefined) {
    // Daily data volume = daily contact time × data rate (Gbit = 1e9 bit) (definition).
    values.dataVolumePerDay = (stats.contactPerDay * dataRate) / 1e9;
    values.dataVolumePerDayMin = (stats.contactPerDayMin * dataRate) / 1e9;
  } else {
    unavailable.dataVolumePerDay = unavailable.dataVolumePerDayMin = "the daily data volume needs given.dataRate (bit/s)";
  }
  if (stations.length > 1) messages.push(`${stations.length} stations: the figures count the union of their contact (overlapping passes count once)`);
  messages.push("time zero is the given state with the prime meridian along the inertial x axis; the daily figures depend on that phase and on the span");
  return { passes, days, values, unavailable, messages };
}

export const contactTimeKind: CoverageKindDef = {
  summary: "passes per day, daily contact time and gaps over ground stations, with J2 drift and the body's rotation",
  givenRule: `an orbit (altitude, or two shape values), inclination, optional raan, argPeriapsis and trueAnomaly at time zero; stations; optional days (default ${DEFAULT_CONTACT_DAYS}, at most ${MAX_CONTACT_DAYS}) and dataRate (bit/s)`,
  given: [
    ...ORBIT_SHAPE_NAMES.map((n): [string, "choice"] => [n, "choice"]),
    ["inclination", "required"],
    ["raan", "optional"],
    ["argPeriapsis", "optional"],
    ["trueAnomaly", "optional"],
    ["stations", "required"],
    ["days", "optional"],
    ["dataRate", "optional"],
  ],
  computed: [
    "passesPerDay",
    "passesPerDayMin",
    "passesPerDayMax",
    "contactPerDay",
    "contactPerDayMin",
    "longestPass",
    "shortestPass",
    "longestGap",
    "dataVolumePerDay",
    "dataVolumePerDayMin",
  ],
  evaluate(g, body) {
    const r = contactFromInputs(g, body);
    const { a, e } = readClosedShape(g, body);
    const p = a * (1 - e * e);
    return evaluation(r.values, body, {
      unavailable: r.unavailable,
      messages: r.messages,
      conics: [{ label: "orbit", p, e, periapsisRadius: a * (1 - e), apoapsisRadius: a * (1 + e), argPeriapsis: g.optNum("argPeriapsis") ?? 0 }],
    });
  },
};

/** Station-days of contact search one request may ask for (one claim of 10 stations × 30 days). */
export const MAX_CONTACT_STATION_DAYS_PER_REQUEST = 300;

/**
 * Indexes of the contactTime claims of a request that go beyond its search budget (counted in
 * request order), so a single request cannot keep the server busy for long.
 */
export function claimsOverContactBudget(claims: readonly unknown[]): Set<number> {
  const over = new Set<number>();
  let used = 0;
  claims.forEach((c, index) => {
    if (typeof c !== "object" || c === null || (c as { kind?: unknown }).kind !== "contactTime") return;
    const given = (c as { given?: unknown }).given;
    const g = typeof given === "object" && given !== null ? (given as Record<string, unknown>) : {};
    const stations = Array.isArray(g.stations) ? Math.max(1, g.stations.length) : 1;
    const days = typeof g.days === "number" && Number.isFinite(g.days) && g.days > 0 ? Math.min(g.days, MAX_CONTACT_DAYS) : DEFAULT_CONTACT_DAYS;
    used += stations * days;
    if (used > MAX_CONTACT_STATION_DAYS_PER_REQUEST) over.add(index);
  });
  return over;
}

export const CONTACT_BUDGET_MESSAGE = `this request asks for more than ${MAX_CONTACT_STATION_DAYS_PER_REQUEST} station-days of contact search in all; send this claim in another request`;
