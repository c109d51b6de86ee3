/**
 * The requirement types a chair can put on a call. Each is one entry of REQUIREMENT_TYPES:
 * its parameters (zod), the form fields, presets, the claim kinds it concerns, and how it
 * judges one claim from the server's recomputation. Add a type by adding an entry.
 */
import { z } from "zod";
import type { CallRequirement, RequirementClaim, RequirementDefinition, RequirementOutcome, RequirementRow } from "./types";

const pct = (x: number) => `${Number((x * 100).toFixed(2))} %`;
const num = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);

/** A fraction for a margin: 0 or more, below 100 %. */
const marginFraction = (what: string) =>
  z
    .number({ error: `${what} must be a number (a fraction: 0.05 for 5 %)` })
    .min(0, `${what} cannot be negative`)
    .max(0.99, `${what} must be below 100 %`);

function notEvaluated(reason: string) {
  return { status: "notEvaluated" as const, reason, rows: [] };
}

/** A claim the engine could not evaluate cannot be judged against a requirement. */
function invalidClaim(claim: RequirementClaim) {
  return claim.status === "invalid" ? notEvaluated("the claim cannot be evaluated (fix its inputs first)") : null;
}

// ---------------------------------------------------------------------------------------

const deltaVMarginParams = z.strictObject({
  deterministicMargin: marginFraction("the deterministic margin"),
  statisticalMargin: marginFraction("the statistical margin"),
});

const deltaVMargin: RequirementDefinition<z.infer<typeof deltaVMarginParams>> = {
  type: "deltaVMargin",
  name: "Minimum Δv margin per phase type",
  description:
    "Each phase of the Δv budget carries at least this margin on its Δv, by phase type, and the budget still closes (the loaded propellant covers every phase with its margin).",
  params: deltaVMarginParams,
  fields: [
    { name: "deterministicMargin", label: "Deterministic phases: minimum margin", unit: "%", scale: 100, help: "planned manoeuvres known in advance" },
    { name: "statisticalMargin", label: "Statistical phases: minimum margin", unit: "%", scale: 100, help: "corrections sized from dispersions" },
  ],
  presets: [],
  defaultRationale: "Budgets carry margins until the design matures; the board asks for them per phase type so that a shortfall shows where it is.",
  kinds: ["deltaVBudget"],
  summary: (p) => `Δv margin at least ${pct(p.deterministicMargin)} on deterministic phases and ${pct(p.statisticalMargin)} on statistical phases`,
  evaluate(p, claim) {
    const bad = invalidClaim(claim);
    if (bad) return bad;
    const phases = claim.computed.phases;
    const rows: RequirementRow[] = [];
    const problems: string[] = [];
    if (Array.isArray(phases) && phases.length > 0) {
      for (const ph of phases as Record<string, unknown>[]) {
        const type = ph.type === "statistical" ? "statistical" : "deterministic";
        const required = type === "statistical" ? p.statisticalMargin : p.deterministicMargin;
        const actual = num(ph.margin) ?? 0;
        rows.push({ label: `${String(ph.name)} (${type}) margin`, actual, required, unit: "fraction", sense: "min", closeWithin: 0.05 });
        if (actual < required) problems.push(`phase "${String(ph.name)}" carries ${pct(actual)}, the call asks ${pct(required)} for ${type} phases`);
      }
      if (claim.computed.closes === false) {
        const need = num(claim.computed.propellantRequired);
        const have = num(claim.computed.propellantUsable);
        problems.push(
          `the budget does not close with its margins${need !== null && have !== null ? `: it needs ${need.toFixed(1)} kg of propellant, ${have.toFixed(1)} kg are usable` : ""}${
            claim.computed.closesWithoutStatisticalMargins === true ? " (it closes only without the statistical phases' margin)" : ""
          }`,
        );
      }
    } else {
      // A budget without phases: its overall margin against the deterministic margin.
      const actual = num(claim.computed.margin);
      if (actual === null) return notEvaluated("the budget has no margin to judge");
      rows.push({ label: "Overall Δv margin", actual, required: p.deterministicMargin, unit: "fraction", sense: "min", closeWithin: 0.05 });
      if (actual < p.deterministicMargin)
        problems.push(
          `the overall margin is ${pct(actual)}, the call asks ${pct(p.deterministicMargin)} (the budget has no phases, so the deterministic margin applies)`,
        );
    }
    if (problems.length > 0) return { status: "notMet", reason: problems.join("; "), rows };
    if (!Array.isArray(phases) || phases.length === 0)
      return { status: "met", reason: `the overall margin is ${pct(rows[0]!.actual!)}, the call asks ${pct(p.deterministicMargin)}`, rows };
    return { status: "met", reason: "every phase carries the margin the call asks, and the budget closes", rows };
  },
};

// ---------------------------------------------------------------------------------------

const massMarginParams = z.strictObject({ minimumMargin: marginFraction("the minimum system margin") });

const systemMassMargin: RequirementDefinition<z.infer<typeof massMarginParams>> = {
  type: "systemMassMargin",
  name: "Minimum system mass margin",
  description:
    "The mass budget keeps at least this system margin over the dry mass with growth allowances; with a launch allowance, the margin is what the allowance leaves.",
  params: massMarginParams,
  fields: [{ name: "minimumMargin", label: "Minimum system margin", unit: "%", scale: 100, help: "over the dry mass including growth allowances" }],
  presets: [],
  defaultRationale: "Mass grows as a design matures; a system margin on top of the item growth allowances keeps the launch allowance within reach.",
  kinds: ["massBudget"],
  summary: (p) => `System mass margin at least ${pct(p.minimumMargin)}`,
  evaluate(p, claim) {
    const bad = invalidClaim(claim);
    if (bad) return bad;
    const available = num(claim.computed.systemMarginAvailable);
    const stated = num(claim.given.systemMargin);
    const actual = available ?? stated;
    if (actual === null) return notEvaluated("the mass budget states no system margin");
    const rows: RequirementRow[] = [{ label: "System mass margin", actual, required: p.minimumMargin, unit: "fraction", sense: "min", closeWithin: 0.05 }];
    const problems: string[] = [];
    if (actual < p.minimumMargin) problems.push(`the system margin is ${pct(actual)}, the call asks at least ${pct(p.minimumMargin)}`);
    if (claim.computed.fits === false) problems.push("the total with margin exceeds the launch allowance");
    if (problems.length > 0) return { status: "notMet", reason: problems.join("; "), rows };
    return { status: "met", reason: `the system margin is ${pct(actual)}`, rows };
  },
};

// ---------------------------------------------------------------------------------------

const disposalParams = z.strictObject({
  years: z
    .number({ error: "the deadline must be a number of years" })
    .positive("the deadline must be more than 0 years")
    .max(200, "the deadline must be at most 200 years"),
});

const COMMON_PRACTICE = "Both are common practice, not the rule of any one authority: the mission's licensing authority decides which applies.";

const disposalDeadline: RequirementDefinition<z.infer<typeof disposalParams>> = {
  type: "disposalDeadline",
  name: "Disposal within a number of years",
  description:
    "After the end of the mission, the spacecraft re-enters (its perigee falls below 100 km) within this many years, by a disposal burn or by natural decay.",
  params: disposalParams,
  fields: [{ name: "years", label: "Deadline after the end of the mission", unit: "years", scale: 1, help: "time from end of mission to re-entry" }],
  presets: [
    {
      label: "25 years (the long-standing international debris-mitigation guideline)",
      params: { years: 25 },
      rationale: `A 25-year post-mission lifetime is the long-standing international debris-mitigation guideline. ${COMMON_PRACTICE}`,
    },
    {
      label: "5 years (a stricter rule some regulators now apply)",
      params: { years: 5 },
      rationale: `Some regulators now apply a stricter 5-year post-mission lifetime. ${COMMON_PRACTICE}`,
    },
  ],
  defaultRationale: `Spacecraft left in orbit add to the debris population; the board asks for re-entry within a stated time. ${COMMON_PRACTICE}`,
  kinds: ["disposal", "lifetime"],
  summary: (p) => `Re-entry within ${p.years} years after the end of the mission`,
  evaluate(p, claim) {
    const bad = invalidClaim(claim);
    if (bad) return bad;
    const years = num(claim.computed.lifetimeYears);
    if (years === null) return notEvaluated("no lifetime could be computed for this claim");
    const rows: RequirementRow[] = [{ label: "Orbital lifetime", actual: years, required: p.years, unit: "years", sense: "max", closeWithin: p.years * 0.05 }];
    const capped = claim.computed.reentered === false;
    const how = claim.kind === "disposal" && num(claim.computed.deltaV) ? "after the disposal burn" : "by natural decay";
    if (capped || years > p.years)
      return {
        status: "notMet",
        reason: `${capped ? `the orbit does not decay within the ${years.toFixed(0)} years computed` : `re-entry takes ${years.toFixed(1)} years ${how}`}; the call asks at most ${p.years} years: lower the perigee with a disposal burn`,
        rows,
      };
    return { status: "met", reason: `re-entry in ${years.toFixed(1)} years ${how}`, rows };
  },
};

// ---------------------------------------------------------------------------------------

const eclipseParams = z.strictObject({
  maximumDuration: z
    .number({ error: "the maximum eclipse duration must be a number" })
    .positive("the maximum eclipse duration must be more than 0")
    .max(86400, "the maximum eclipse duration must be at most a day"),
});

const maxEclipse: RequirementDefinition<z.infer<typeof eclipseParams>> = {
  type: "maxEclipse",
  name: "Maximum eclipse duration",
  description: "The longest time in shadow per orbit stays within this duration (power and thermal design).",
  params: eclipseParams,
  fields: [{ name: "maximumDuration", label: "Longest eclipse per orbit", unit: "min", scale: 1 / 60, help: "time in shadow on one orbit" }],
  presets: [],
  defaultRationale: "Batteries and heaters are sized for the longest eclipse; the board asks that the orbit stays within it.",
  kinds: ["eclipse"],
  summary: (p) => `Eclipse at most ${Number((p.maximumDuration / 60).toFixed(1))} min per orbit`,
  evaluate(p, claim) {
    const bad = invalidClaim(claim);
    if (bad) return bad;
    const d = num(claim.computed.eclipseDuration);
    if (d === null) return notEvaluated("no eclipse duration could be computed");
    const rows: RequirementRow[] = [
      { label: "Eclipse duration", actual: d, required: p.maximumDuration, unit: "s", sense: "max", closeWithin: p.maximumDuration * 0.05 },
    ];
    if (d > p.maximumDuration)
      return { status: "notMet", reason: `the eclipse lasts ${(d / 60).toFixed(1)} min, the call allows ${(p.maximumDuration / 60).toFixed(1)} min`, rows };
    return { status: "met", reason: `the eclipse lasts ${(d / 60).toFixed(1)} min`, rows };
  },
};

// ---------------------------------------------------------------------------------------
// Coverage and links (contactTime, linkBudget)

const minutesText = (s: number) => `${Number((s / 60).toFixed(1))} min`;
const hoursText = (s: number) => `${Number((s / 3600).toFixed(1))} h`;

/** Names of the stations a contact claim counts (its given.stations). */
function claimStationNames(claim: RequirementClaim): string[] {
  const st = claim.given.stations;
  return Array.isArray(st) ? st.map((x) => (typeof x === "object" && x !== null ? String((x as { name?: unknown }).name ?? "") : "")).filter(Boolean) : [];
}

/** The contact claim counts only stations the call names (when it names any). */
function unnamedStations(names: readonly string[] | undefined, claim: RequirementClaim): string[] {
  if (!names || names.length === 0) return [];
  return claimStationNames(claim).filter((n) => !names.includes(n));
}

const contactParams = z.strictObject({
  minimumPerDay: z
    .number({ error: "the minimum daily contact must be a number" })
    .positive("the minimum daily contact must be more than 0")
    .max(86400, "the minimum daily contact must be at most a day"),
  stations: z.array(z.string().trim().min(1).max(80)).max(20, "name at most 20 stations").optional(),
});

const minDailyContact: RequirementDefinition<z.infer<typeof contactParams>> = {
  type: "minDailyContact",
  name: "Minimum daily contact time",
  description:
    "On the day with the least contact in the dossier's contact check, the spacecraft is in view of the stations (above their minimum elevation) at least this long. When the call names stations, only those may be counted.",
  params: contactParams,
  fields: [{ name: "minimumPerDay", label: "Least contact in any one day", unit: "min", scale: 1 / 60, help: "summed over the day's passes" }],
  stationList: {
    name: "stations",
    legend: "Stations that may be counted (optional)",
    help: "Tick none to count any station the dossier uses.",
  },
  presets: [],
  defaultRationale: "Data comes home only while a station sees the spacecraft; the board asks for enough contact every day, not only on average.",
  kinds: ["contactTime"],
  summary: (p) => `Contact at least ${minutesText(p.minimumPerDay)} every day${p.stations?.length ? ` at ${p.stations.join(", ")}` : ""}`,
  evaluate(p, claim) {
    const bad = invalidClaim(claim);
    if (bad) return bad;
    const least = num(claim.computed.contactPerDayMin);
    if (least === null) return notEvaluated("no daily contact could be computed");
    const rows: RequirementRow[] = [
      { label: "Least daily contact", actual: least, required: p.minimumPerDay, unit: "s", sense: "min", closeWithin: p.minimumPerDay * 0.1 },
    ];
    const others = unnamedStations(p.stations, claim);
    if (others.length > 0)
      return { status: "notMet", reason: `the contact counts ${others.join(", ")}, which the call does not name (it names ${p.stations!.join(", ")})`, rows };
    if (least < p.minimumPerDay)
      return {
        status: "notMet",
        reason: `the day with the least contact has ${minutesText(least)}, the call asks at least ${minutesText(p.minimumPerDay)}: add a station or lower the minimum elevation`,
        rows,
      };
    return { status: "met", reason: `at least ${minutesText(least)} of contact every day`, rows };
  },
};

const gapParams = z.strictObject({
  maximumGap: z
    .number({ error: "the maximum gap must be a number" })
    .positive("the maximum gap must be more than 0")
    .max(30 * 86400, "the maximum gap must be at most 30 days"),
});

const maxContactGap: RequirementDefinition<z.infer<typeof gapParams>> = {
  type: "maxContactGap",
  name: "Maximum gap between contacts",
  description: "The longest time without contact in the dossier's contact check stays within this duration.",
  params: gapParams,
  fields: [
    { name: "maximumGap", label: "Longest time without contact", unit: "h", scale: 1 / 3600, help: "between the end of one pass and the start of the next" },
  ],
  presets: [],
  defaultRationale: "On-board storage and commanding need a station regularly; the board bounds the longest silence.",
  kinds: ["contactTime"],
  summary: (p) => `No more than ${hoursText(p.maximumGap)} without contact`,
  evaluate(p, claim) {
    const bad = invalidClaim(claim);
    if (bad) return bad;
    const gap = num(claim.computed.longestGap);
    if (gap === null) return notEvaluated("no gap could be computed");
    const rows: RequirementRow[] = [{ label: "Longest gap", actual: gap, required: p.maximumGap, unit: "s", sense: "max", closeWithin: p.maximumGap * 0.1 }];
    if (gap > p.maximumGap) return { status: "notMet", reason: `the longest gap is ${hoursText(gap)}, the call allows ${hoursText(p.maximumGap)}`, rows };
    return { status: "met", reason: `the longest gap is ${hoursText(gap)}`, rows };
  },
};

const linkParams = z.strictObject({
  minimumMargin: z
    .number({ error: "the minimum link margin must be a number of dB" })
    .min(0, "the minimum link margin cannot be negative")
    .max(30, "the minimum link margin must be at most 30 dB"),
});

const minLinkMargin: RequirementDefinition<z.infer<typeof linkParams>> = {
  type: "minLinkMargin",
  name: "Minimum link margin",
  description: "The link budget closes with at least this margin in Eb/N0 over what the modulation and coding need.",
  params: linkParams,
  fields: [{ name: "minimumMargin", label: "Minimum link margin", unit: "dB", scale: 1, help: "received Eb/N0 minus the required Eb/N0" }],
  presets: [
    {
      label: "3 dB (common practice)",
      params: { minimumMargin: 3 },
      rationale: "A 3 dB link margin is common practice for screening, not the rule of any authority.",
    },
  ],
  defaultRationale: "Links lose margin to weather, pointing and ageing; the board asks for a margin on top of the stated losses.",
  kinds: ["linkBudget"],
  summary: (p) => `Link margin at least ${p.minimumMargin} dB`,
  evaluate(p, claim) {
    const bad = invalidClaim(claim);
    if (bad) return bad;
    const margin = num(claim.computed.margin);
    if (margin === null) return notEvaluated("no link margin could be computed");
    const rows: RequirementRow[] = [{ label: "Link margin", actual: margin, required: p.minimumMargin, unit: "dB", sense: "min", closeWithin: 1 }];
    if (margin < p.minimumMargin)
      return { status: "notMet", reason: `the link margin is ${margin.toFixed(1)} dB, the call asks at least ${p.minimumMargin} dB`, rows };
    return { status: "met", reason: `the link margin is ${margin.toFixed(1)} dB`, rows };
  },
};

// ---------------------------------------------------------------------------------------

/** Every requirement type, in the order the chair's list shows them. Add new types here. */
export const REQUIREMENT_TYPES: readonly RequirementDefinition[] = [
  deltaVMargin,
  systemMassMargin,
  disposalDeadline,
  maxEclipse,
  minDailyContact,
  maxContactGap,
  minLinkMargin,
] as unknown as readonly RequirementDefinition[];

export function requirementType(type: string): RequirementDefinition | undefined {
  return REQUIREMENT_TYPES.find((d) => d.type === type);
}

/** The one-line summary of a stored requirement (its type's wording, or a fallback). */
export function requirementSummary(r: Pick<CallRequirement, "type" | "params">): string {
  const def = requirementType(r.type);
  if (!def) return `unknown requirement "${r.type}"`;
  const parsed = def.params.safeParse(r.params);
  return parsed.success ? def.summary(parsed.data) : def.name;
}

/** Judges one claim against every requirement of the call that concerns its kind. */
export function evaluateRequirements(requirements: readonly CallRequirement[], claim: RequirementClaim): RequirementOutcome[] {
  const out: RequirementOutcome[] = [];
  for (const r of requirements) {
    const def = requirementType(r.type);
    if (!def || !def.kinds.includes(claim.kind)) continue;
    const parsed = def.params.safeParse(r.params);
    const title = requirementSummary(r);
    if (!parsed.success) {
      out.push({ requirementId: r.id, type: r.type, title, status: "notEvaluated", reason: "the requirement's parameters are not valid", rows: [] });
      continue;
    }
    try {
      out.push({ requirementId: r.id, type: r.type, title, ...def.evaluate(parsed.data, claim) });
    } catch {
      out.push({ requirementId: r.id, type: r.type, title, status: "notEvaluated", reason: "the requirement could not be judged on this claim", rows: [] });
    }
  }
  return out;
}

/** Requirements of the call that no claim of the dossier addresses (shown as not evaluated). */
export function unaddressedRequirements(requirements: readonly CallRequirement[], kinds: readonly string[]): CallRequirement[] {
  return requirements.filter((r) => {
    const def = requirementType(r.type);
    return def !== undefined && !def.kinds.some((k) => kinds.includes(k));
  });
}

/** The smallest deterministic Δv margin the call asks (for the rail's total margin), 0 without one. */
export function requiredDeltaVMargin(requirements: readonly Pick<CallRequirement, "type" | "params">[]): number {
  let m = 0;
  for (const r of requirements) {
    if (r.type !== "deltaVMargin") continue;
    const v = r.params.deterministicMargin;
    if (typeof v === "number" && Number.isFinite(v)) m = Math.max(m, v);
  }
  return m;
}
