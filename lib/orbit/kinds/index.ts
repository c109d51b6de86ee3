/**
 * The claim kinds of the contract: what each takes, what it derives, and how.
 * Each evaluator reads validated inputs, calls the physics modules and returns every
 * quantity it can derive, plus reasons for the ones that do not exist for this case
 * (e.g. a period asked of a hyperbola). One file per kind in this folder; the registry
 * (registry.ts) lists them and derives the `KindName` union.
 */
export type { ComputedInfo, EvaluateOptions, Evaluation, GivenInfo, KindDef, KindInfo, PlotConic } from "./types";
export { Inputs } from "./types";
export {
  allowedGiven,
  defaultBodyOf,
  isKindName,
  KIND_DEFS,
  KIND_NAMES,
  kindDef,
  ORBIT_CHECK_KINDS,
  QUANTITY_ALIASES,
  usesBody,
  type KindName,
} from "./registry";
