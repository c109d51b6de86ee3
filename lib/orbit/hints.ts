/**
 * Hints of contract version 2: the likely slip behind a failing check. The search tries the
 * codes in the contract's order and keeps the first that matches; each match is judged by
 * the check's own tolerance rule applied to the corrected value, with the precision allowance
 * scaled by the same factor. A hint never changes a status.
 */
import { BODIES, STANDARD_GRAVITY_KM_S2, type Body, type BodyName } from "./constants";
import { fmt } from "./errors";
import { HINT_CODES, type ComputedValue, type Hint, type HintCode } from "./schema";
import { ANGLE_UNIT, scalarAgrees, vectorAgrees, type Tolerance } from "./tolerance";
import { quantityInfo } from "./quantities";
import { RAD } from "./vector";

/** Sidereal day from the WGS-84 rotation rate: 2π / 7.292115e-5 rad/s = 86 164.1006 s. */
export const SIDEREAL_DAY_S = (2 * Math.PI) / BODIES.earth.rotationRate.value;
/** Mean solar day, s (the SI day). */
export const SOLAR_DAY_S = 86_400;

/** Factors of the `unit-scale` hint, in the contract's order. */
export const UNIT_SCALE_FACTORS = [1000, 0.001, 60, 1 / 60, 3600, 1 / 3600, 86400, 1 / 86400] as const;

/** Standard gravity as a slip may have used it, km/s²: 9.81 m/s², or left out (1 m/s², i.e. Isp·ln R read as m/s). */
const G0_SLIPS = [
  { g0: 9.81e-3, words: "g0 taken as 9.81 m/s² instead of 9.80665 m/s²" },
  { g0: 1e-3, words: "g0 left out (Isp·ln(m0/mf) read as m/s)" },
  { g0: 1, words: "g0 left out (Isp·ln(m0/mf) read as km/s)" },
] as const;

/** A commonly used alternative to a table constant (docs/engine.md lists them with sources). */
export interface OtherConstant {
  body: BodyName;
  constant: "radius" | "mu" | "year" | "j2";
  value: number;
  /** How the value is known, for the hint's sentence. */
  label: string;
  source: string;
}

/** The documented list behind `other-constants` (docs/engine.md, "Other constants"). */
export const OTHER_CONSTANTS: readonly OtherConstant[] = [
  {
    body: "earth",
    constant: "radius",
    value: 6371,
    label: "Earth's mean radius 6371 km",
    source: "IUGG mean radius R1 = 6371.0088 km (Moritz, Geodetic Reference System 1980, Bulletin Géodésique 54), commonly rounded to 6371 km",
  },
  {
    body: "earth",
    constant: "radius",
    value: 6378,
    label: "Earth's equatorial radius rounded to 6378 km",
    source: "WGS-84 a = 6378.137 km rounded to the kilometre (common practice)",
  },
  {
    body: "earth",
    constant: "mu",
    value: 398_600,
    label: "μ = 398600 km³/s²",
    source: "WGS-84 GM = 398600.4418 km³/s² rounded to six figures (common practice in handbooks)",
  },
  {
    body: "earth",
    constant: "year",
    value: 365.25,
    label: "a 365.25-day (Julian) year",
    source: "IAU Julian year of 365.25 days of 86400 s (IAU 1976 system of constants)",
  },
  {
    body: "earth",
    constant: "year",
    value: 365.256_363,
    label: "a sidereal year of 365.2564 days",
    source: "sidereal year 365.256363 d, Astronomical Almanac (recalled from memory)",
  },
  { body: "earth", constant: "year", value: 365, label: "a 365-day year", source: "calendar year of 365 days (common practice in rough estimates)" },
  {
    body: "mars",
    constant: "radius",
    value: 3389.5,
    label: "Mars's mean radius 3389.5 km",
    source: "IAU WGCCRE 2015 (Archinal et al. 2018) mean radius of Mars 3389.50 km, recalled from memory",
  },
  {
    body: "mars",
    constant: "year",
    value: 686.98,
    label: "Mars's sidereal year of 686.98 days",
    source: "NASA GSFC Mars Fact Sheet, sidereal orbit period 686.980 d, recalled from memory",
  },
  {
    body: "moon",
    constant: "radius",
    value: 1737.1,
    label: "the Moon's mean radius 1737.1 km",
    source: "IAU WGCCRE 2015 mean lunar radius 1737.4 km vs. the LOLA-era 1737.1 km figure, recalled from memory",
  },
  {
    body: "sun",
    constant: "mu",
    value: 1.327e11,
    label: "GM☉ = 1.327e11 km³/s²",
    source: "IAU 2015 nominal GM☉ = 1.3271244e11 km³/s² rounded to four figures (common practice)",
  },
];

/** Everything the hint search needs to know about one failing check. */
export interface HintContext {
  quantity: string;
  unit: string;
  /** The claimed value as read (number or three numbers). */
  claimed: number | readonly number[];
  /** The claimed value's precision allowance (per vector: the length of the component allowances). */
  precision: number;
  computed: number | readonly number[];
  tolerance: Tolerance;
  /** Every quantity the kind computed for this claim. */
  computedAll: Record<string, ComputedValue>;
  kind: string;
  /** The body the claim used, or undefined when the kind does not use one. */
  body: Body | undefined;
  /** The table body the claim started from, when it named one. */
  bodyName: BodyName | undefined;
  /** Body fields the claim overrode (their table alternatives are not tried). */
  overridden: ReadonlySet<string>;
  /** Recomputes the kind with another body (default: the claim's own) or standard gravity; undefined when it cannot. */
  recompute(body?: Body, g0?: number): Record<string, ComputedValue> | undefined;
}

const ROCKET_KINDS = new Set(["rocket", "deltaVBudget"]);
/** Kinds whose values depend on the body's year. */
const YEAR_KINDS = new Set(["sunSynchronous"]);
/** Units of a period or a rate that a solar/sidereal day mix-up scales. */
const DAY_UNITS = new Set(["s", "deg/day", "deg/s", "rev/day"]);
/** Units of an angle or angular rate that may have been given in radians. */
const ANGULAR_UNITS = new Set(["deg", "deg/day", "deg/s"]);
/** Pairs that are one quantity under two names (not a slip). */
const ALIASES: Record<string, string> = { centralAngle: "earthCentralAngle", earthCentralAngle: "centralAngle" };

type Value = number | readonly number[];

function agrees(claimed: Value, computed: ComputedValue | Value | undefined, unit: string, precision: number, tol: Tolerance): boolean {
  if (computed === undefined) return false;
  if (typeof claimed === "number") return typeof computed === "number" && scalarAgrees(claimed, computed, unit, precision, tol);
  return Array.isArray(computed) && vectorAgrees(claimed, computed, unit, precision, tol);
}

const times = (v: Value, f: number): Value => (typeof v === "number" ? v * f : v.map((c) => c * f));

function factorWords(f: number): string {
  if (f >= 1) return `× ${fmt(f)}`;
  return `÷ ${fmt(1 / f)}`;
}

/** What a written value looks like it was written in, when × factor makes it agree. */
function scaleSlip(unit: string, f: number): string | undefined {
  const table: Record<string, Record<string, string>> = {
    s: { "60": "minutes", "3600": "hours", "86400": "days", "0.001": "milliseconds" },
    km: { "0.001": "metres", "1000": "thousands of kilometres" },
    "km/s": { "0.001": "m/s", "1000": "thousands of km/s", "0.0002777777777777778": "km/h" },
    kg: { "1000": "tonnes", "0.001": "grams" },
    "deg/day": { "86400": "deg/s", "0.016666666666666666": "deg/min" },
    "deg/s": { "0.000011574074074074073": "deg/day", "0.016666666666666666": "deg/min" },
  };
  return table[unit]?.[String(f)];
}

function make(code: HintCode, message: string, fields: Partial<Hint> = {}): Hint {
  return { code, message, ...fields };
}

/** The first hint that explains a failing check, or undefined. Never throws. */
export function findHint(ctx: HintContext): Hint | undefined {
  try {
    return search(ctx);
  } catch {
    return undefined;
  }
}

function search(ctx: HintContext): Hint | undefined {
  const { quantity: q, unit, claimed, precision, tolerance: tol } = ctx;
  const isAngle = unit === ANGLE_UNIT;
  const shown = (v: Value) => (typeof v === "number" ? `${fmt(v)} ${unit}`.trim() : `[${v.map((c) => fmt(c)).join(", ")}] ${unit}`.trim());

  // other-quantity: equals another quantity the kind computed in the same unit.
  for (const [k, v] of Object.entries(ctx.computedAll)) {
    if (k === q || ALIASES[q] === k || typeof v === "string" || typeof v === "boolean") continue;
    if (quantityInfo(k)?.unit !== unit) continue;
    if (agrees(claimed, v, unit, precision, tol))
      return make("other-quantity", `${q} as written equals the computed ${k} (${shown(v)}): was ${k} written where ${q} was meant?`, { quantity: k });
  }

  // altitude-radius: ± the body's radius.
  if (unit === "km" && ctx.body && ctx.body.radius > 0 && typeof claimed === "number") {
    const R = ctx.body.radius;
    if (agrees(claimed + R, ctx.computed, unit, precision, tol))
      return make(
        "altitude-radius",
        `${q} agrees once ${ctx.body.name}'s radius (${fmt(R)} km) is added: an altitude seems to be written where a radius was meant`,
      );
    if (agrees(claimed - R, ctx.computed, unit, precision, tol))
      return make(
        "altitude-radius",
        `${q} agrees once ${ctx.body.name}'s radius (${fmt(R)} km) is taken away: a radius seems to be written where an altitude was meant`,
      );
  }

  // unit-scale: never for angles.
  if (!isAngle) {
    for (const f of UNIT_SCALE_FACTORS) {
      if (agrees(times(claimed, f), ctx.computed, unit, precision * f, tol)) {
        const slip = scaleSlip(unit, f);
        return make(
          "unit-scale",
          slip
            ? `${q} agrees ${factorWords(f)}: it looks like ${slip} where ${unit} were meant`
            : `${q} agrees ${factorWords(f)}: it looks like a unit slip (the value must be in ${unit || "the quantity's unit"})`,
          { factor: f },
        );
      }
    }
  }

  // degrees-radians: a claimed angle or angular rate of at most 2π in size.
  if (ANGULAR_UNITS.has(unit) && typeof claimed === "number" && Math.abs(claimed) <= 2 * Math.PI) {
    if (agrees(claimed * RAD, ctx.computed, unit, precision * RAD, tol))
      return make("degrees-radians", `${q} agrees × 180/π: it looks like radians where degrees were meant`, { factor: RAD });
  }

  // solar-day: a solar day and a sidereal day exchanged (periods and rates).
  if (!isAngle && DAY_UNITS.has(unit)) {
    const r = SIDEREAL_DAY_S / SOLAR_DAY_S;
    for (const f of [r, 1 / r]) {
      if (agrees(times(claimed, f), ctx.computed, unit, precision * f, tol))
        return make(
          "solar-day",
          `${q} agrees when a solar day (86400 s) and a sidereal day (${fmt(SIDEREAL_DAY_S)} s) are exchanged: the ${f < 1 ? "solar" : "sidereal"} day seems to be used where the ${f < 1 ? "sidereal" : "solar"} one belongs`,
        );
    }
  }

  // standard-gravity: a rocket quantity with g0 left out or taken as 9.81.
  if (!isAngle && ROCKET_KINDS.has(ctx.kind)) {
    for (const slip of G0_SLIPS) {
      const values = ctx.recompute(undefined, slip.g0);
      if (values && agrees(claimed, values[q], unit, precision, tol))
        return make("standard-gravity", `${q} agrees with ${slip.words}; use g0 = 9.80665 m/s²`, { factor: slip.g0 / STANDARD_GRAVITY_KM_S2 });
    }
  }

  // sign: −claimed agrees.
  if (agrees(times(claimed, -1), ctx.computed, unit, precision, tol))
    return make(
      "sign",
      `${q} agrees with its sign reversed${q === "semiMajorAxis" ? " (a hyperbola's semi-major axis is negative)" : ""}: check the sign convention`,
    );

  // other-constants: the kind recomputed with another commonly used constant for the body.
  if (ctx.body && ctx.bodyName) {
    for (const c of OTHER_CONSTANTS) {
      if (c.body !== ctx.bodyName || ctx.overridden.has(c.constant)) continue;
      // A body's year enters only the sun-synchronous rate.
      if (c.constant === "year" && !YEAR_KINDS.has(ctx.kind)) continue;
      const patched: Body = { ...ctx.body, [c.constant]: c.value };
      if (c.constant === "radius" && !ctx.overridden.has("j2ReferenceRadius")) patched.j2ReferenceRadius = ctx.body.j2ReferenceRadius;
      const values = ctx.recompute(patched);
      if (values && agrees(claimed, values[q], unit, precision, tol))
        return make("other-constants", `${q} agrees when it is recomputed with ${c.label} (the check uses ${fmt(ctx.body[c.constant] as number)})`, {
          constant: `${c.body}.${c.constant}`,
          value: c.value,
        });
    }
  }
  return undefined;
}

/** The codes, re-exported for callers that validate stored hints. */
export { HINT_CODES };

/**
 * A stored hint as a sentence. Stored data may carry a hint from another contract version;
 * an unknown code is named plainly rather than shown raw or thrown.
 */
export function hintSentence(hint: unknown): string {
  if (typeof hint !== "object" || hint === null) return "No explanation was recorded for this check.";
  const h = hint as Record<string, unknown>;
  const code = typeof h.code === "string" ? h.code : "";
  const message = typeof h.message === "string" && h.message.length > 0 ? h.message : undefined;
  if (!(HINT_CODES as readonly string[]).includes(code))
    return `This check carries a hint this version does not know (code ${JSON.stringify(code.slice(0, 40))}); rerun the check for a current explanation.`;
  return message ?? `Likely slip: ${code}.`;
}
