/**
 * The claim kinds of the contract: one entry per kind, each defined in its own file in this
 * folder. `KindName` is the union of the registry's keys; a claim's kind (untrusted text)
 * becomes a `KindName` only through `isKindName` or `kindDef`.
 */
import type { BodyName } from "../constants";
import { quantityInfoFor } from "../quantities";
import { biEllipticKind } from "./bi-elliptic";
import { contactTimeKind } from "./contact-time";
import { deltaVBudgetKind } from "./delta-v-budget";
import { disposalKind } from "./disposal";
import { eclipseKind } from "./eclipse";
import { elementsKind } from "./elements";
import { escapeKind } from "./escape";
import { groundContactKind } from "./ground-contact";
import { hohmannKind } from "./hohmann";
import { interplanetaryHohmannKind } from "./interplanetary-hohmann";
import { j2RatesKind } from "./j2-rates";
import { keplerKind } from "./kepler";
import { lambertKind } from "./lambert";
import { lifetimeKind } from "./lifetime";
import { linkBudgetKind } from "./link-budget";
import { massBudgetKind } from "./mass-budget";
import { orbitKind } from "./orbit";
import { planeChangeKind } from "./plane-change";
import { propagateKind } from "./propagate";
import { repeatGroundTrackKind } from "./repeat-ground-track";
import { rocketKind } from "./rocket";
import { sphereOfInfluenceKind } from "./sphere-of-influence";
import { stateVectorKind } from "./state-vector";
import { sunSynchronousKind } from "./sun-synchronous";
import { timeOfFlightKind } from "./time-of-flight";
import type { KindDef, KindInfo } from "./types";

/** The registry, in the order forms list the kinds. Add a kind with one line here. */
export const KIND_DEFS = {
  orbit: orbitKind,
  stateVector: stateVectorKind,
  elements: elementsKind,
  kepler: keplerKind,
  timeOfFlight: timeOfFlightKind,
  propagate: propagateKind,
  hohmann: hohmannKind,
  biElliptic: biEllipticKind,
  planeChange: planeChangeKind,
  rocket: rocketKind,
  deltaVBudget: deltaVBudgetKind,
  escape: escapeKind,
  interplanetaryHohmann: interplanetaryHohmannKind,
  sphereOfInfluence: sphereOfInfluenceKind,
  j2Rates: j2RatesKind,
  sunSynchronous: sunSynchronousKind,
  lambert: lambertKind,
  eclipse: eclipseKind,
  lifetime: lifetimeKind,
  disposal: disposalKind,
  massBudget: massBudgetKind,
  groundContact: groundContactKind,
  contactTime: contactTimeKind,
  linkBudget: linkBudgetKind,
  repeatGroundTrack: repeatGroundTrackKind,
} as const satisfies Record<string, KindDef>;

/** A claim kind's name: one of the registry's keys. */
export type KindName = keyof typeof KIND_DEFS;

export const KIND_NAMES = Object.keys(KIND_DEFS) as KindName[];

export function isKindName(kind: unknown): kind is KindName {
  return typeof kind === "string" && Object.prototype.hasOwnProperty.call(KIND_DEFS, kind);
}

export function kindDef(kind: string): KindDef | undefined {
  return isKindName(kind) ? KIND_DEFS[kind] : undefined;
}

export function usesBody(kind: string): boolean {
  return kindDef(kind)?.usesBody !== false;
}

export function defaultBodyOf(kind: string): BodyName {
  return kindDef(kind)?.defaultBody ?? "earth";
}

/** Old quantity names still computed and accepted for one contract version. */
export const QUANTITY_ALIASES: Readonly<Record<string, string>> = { earthCentralAngle: "centralAngle" };

/** The kinds with their given and computed quantities, for building forms. */
export const ORBIT_CHECK_KINDS: readonly KindInfo[] = KIND_NAMES.map((kind) => {
  const d: KindDef = KIND_DEFS[kind];
  const info = (name: string) => {
    const q = quantityInfoFor(kind, name);
    if (!q) throw new Error(`quantity ${name} missing from the quantities table`);
    return q;
  };
  return {
    kind,
    summary: d.summary,
    givenRule: d.givenRule,
    defaultBody: d.defaultBody ?? "earth",
    given: d.given.map(([name, use]) => ({ name, unit: info(name).unit, type: info(name).type, use })),
    computed: d.computed.map((name) => ({
      name,
      unit: info(name).unit,
      type: info(name).type,
      ...(QUANTITY_ALIASES[name] ? { aliasOf: QUANTITY_ALIASES[name] } : {}),
    })),
  };
});

export function allowedGiven(kind: string): string[] {
  return (kindDef(kind)?.given ?? []).map(([n]) => n);
}
