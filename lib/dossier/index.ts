// The dossier document format and everything other areas use to read it (see README.md).
export * from "./schema";
export { sanitizeDossier, validateDossier, cleanClaim, dossierSchema } from "./sanitize";
export type { SanitizeResult, ValidateResult } from "./sanitize";
export { renderDossierHtml, dossierPlainText, escapeHtml, formatValue } from "./render";
export type { BlockVerdict, RenderOptions } from "./render";
export {
  extractOrbitChecks,
  resolveClaim,
  evaluateBlocks,
  deltaVBudget,
  dossierHeadings,
  missingSections,
  submissionProblems,
  REFERENCING_KINDS,
  REFERENCEABLE_KINDS,
  MANEUVER_DELTA_V,
  ORBIT_CHECK_CONTRACT_VERSION,
} from "./claims";
export type { OrbitCheckBlock, ResolvedClaim, BlockEvaluation, DeltaVBudget, ReadinessProblem } from "./claims";
