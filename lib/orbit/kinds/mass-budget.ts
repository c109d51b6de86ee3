/**
 * `massBudget`: dry-mass items with growth allowances by design maturity, a system margin,
 * and the total against a launch allowance.
 *
 * Growth allowances per maturity: the equipment-level maturity margins of ESA's "Margin
 * philosophy for science assessment studies" (SRE-PA/2011.097, issue 1 revision 3): 5 % for
 * off-the-shelf items, 10 % for items to be modified, 20 % for new designs; the same note
 * recommends a 20 % system margin on the dry mass including those allowances. Values
 * recalled from memory. ANSI/AIAA S-120A-2015 "Mass Properties Control for Space Systems"
 * tabulates finer allowances by subsystem and drawing status; this kind uses the three
 * maturity classes above.
 */
import { fail, fmt } from "../errors";
import type { KindDef } from "./types";
import type { ComputedValue } from "../schema";
import { evaluation, fieldNumber, objectArray } from "./shared";

export const MATURITIES = ["new", "modified", "offTheShelf"] as const;
export type Maturity = (typeof MATURITIES)[number];

/** Growth allowance per maturity, fraction of the item's mass (ESA SRE-PA/2011.097, from memory). */
export const GROWTH_ALLOWANCE: Readonly<Record<Maturity, number>> = { offTheShelf: 0.05, modified: 0.1, new: 0.2 };

export interface MassItemResult {
  name: string;
  maturity: Maturity;
  mass: number;
  growthFraction: number;
  growthAllowance: number;
  massWithGrowth: number;
}

export interface MassBudgetResult {
  items: MassItemResult[];
  basicMass: number;
  growthAllowance: number;
  massWithGrowth: number;
  systemMarginMass: number;
  totalWithMargin: number;
  wetMass: number;
  allowanceMargin?: number;
  fits?: boolean;
  systemMarginAvailable?: number;
}

export function massBudget(
  items: readonly { name: string; mass: number; maturity: Maturity }[],
  systemMargin: number,
  launchAllowance?: number,
  propellantMass = 0,
): MassBudgetResult {
  if (items.length === 0) fail("given.items is empty: list each item as { name, mass (kg), maturity }");
  if (!(systemMargin >= 0 && systemMargin < 1)) fail(`given.systemMargin must be a fraction from 0 to below 1 (got ${fmt(systemMargin)})`);
  const rows = items.map((it) => {
    const f = GROWTH_ALLOWANCE[it.maturity];
    // Item growth allowance = mass × maturity percentage: ESA, "Margin philosophy for science assessment studies" (SRE-PA/2011.097), maturity margins (recalled from memory).
    return { ...it, growthFraction: f, growthAllowance: it.mass * f, massWithGrowth: it.mass * (1 + f) };
  });
  const basicMass = rows.reduce((s, r) => s + r.mass, 0);
  const growthAllowance = rows.reduce((s, r) => s + r.growthAllowance, 0);
  const massWithGrowth = basicMass + growthAllowance;
  // System margin applied to the dry mass including growth allowances: ESA, "Margin philosophy for science assessment studies" (SRE-PA/2011.097), system margin (recalled from memory).
  const systemMarginMass = massWithGrowth * systemMargin;
  const totalWithMargin = massWithGrowth + systemMarginMass;
  const wetMass = totalWithMargin + propellantMass;
  const out: MassBudgetResult = { items: rows, basicMass, growthAllowance, massWithGrowth, systemMarginMass, totalWithMargin, wetMass };
  if (launchAllowance !== undefined) {
    // Margin left by the allowance, as a fraction of the allowance.
    out.allowanceMargin = (launchAllowance - wetMass) / launchAllowance;
    out.fits = wetMass <= launchAllowance;
    // The system margin the allowance leaves over the dry mass with growth.
    out.systemMarginAvailable = (launchAllowance - propellantMass - massWithGrowth) / massWithGrowth;
  }
  return out;
}

const MATURITY_WORDS: Record<string, Maturity> = { new: "new", modified: "modified", offTheShelf: "offTheShelf" };

export const massBudgetKind: KindDef = {
  usesBody: false,
  summary: "mass budget: growth allowances by maturity, system margin, launch allowance",
  givenRule:
    "items [{ name, mass (kg), maturity: new, modified or offTheShelf }], systemMargin (fraction, e.g. 0.2), optional launchAllowance (kg) and propellantMass (kg, for the wet mass)",
  given: [
    ["items", "required"],
    ["systemMargin", "required"],
    ["launchAllowance", "optional"],
    ["propellantMass", "optional"],
  ],
  computed: [
    "basicMass",
    "growthAllowance",
    "massWithGrowth",
    "systemMarginMass",
    "totalWithMargin",
    "wetMass",
    "allowanceMargin",
    "systemMarginAvailable",
    "fits",
    "massItems",
  ],
  evaluate(g, body) {
    const raw = objectArray(g, "items", '[{ "name": "structure", "mass": 12.5, "maturity": "new" }]', 300);
    const items = raw.map((o, i) => {
      const path = `items[${i}]`;
      const mass = fieldNumber(o, path, "mass", "kg");
      if (mass < 0) fail(`${path}.mass cannot be negative (got ${fmt(mass)} kg${typeof o.name === "string" ? ` for "${o.name}"` : ""})`);
      const maturity = typeof o.maturity === "string" ? MATURITY_WORDS[o.maturity] : undefined;
      if (!maturity) fail(`${path}.maturity must be new, modified or offTheShelf`);
      return { name: typeof o.name === "string" && o.name.trim() ? o.name.slice(0, 120) : `item ${i + 1}`, mass, maturity };
    });
    const allowance = g.has("launchAllowance") ? g.num("launchAllowance", "positive") : undefined;
    const propellant = g.has("propellantMass") ? g.num("propellantMass", "nonNegative") : 0;
    const b = massBudget(items, g.num("systemMargin", "nonNegative"), allowance, propellant);
    const values: Record<string, ComputedValue> = {
      basicMass: b.basicMass,
      growthAllowance: b.growthAllowance,
      massWithGrowth: b.massWithGrowth,
      systemMarginMass: b.systemMarginMass,
      totalWithMargin: b.totalWithMargin,
      wetMass: b.wetMass,
      massItems: b.items as unknown as Record<string, string | number>[],
    };
    const ev = evaluation(values, body);
    if (b.allowanceMargin !== undefined) {
      values.allowanceMargin = b.allowanceMargin;
      values.fits = b.fits!;
      values.systemMarginAvailable = b.systemMarginAvailable!;
    } else {
      for (const q of ["allowanceMargin", "fits", "systemMarginAvailable"]) ev.unavailable[q] = `${q} needs given.launchAllowance (kg)`;
    }
    return ev;
  },
};
