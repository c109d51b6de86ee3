// The contract's constants with no engine behind them, so that a page showing a stored
// verdict can print the notice without loading the engine (and zod) into the browser.

/** The contract version this engine implements. */
export const CONTRACT_VERSION = 2;

/** The caution every response carries (contract version 2, "Other additions"). */
export const NOTICE =
  "Two-body screening estimates, not flight-qualified analysis. The mission's own flight dynamics, mission assurance and its licensing authority's rules govern.";
