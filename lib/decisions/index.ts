/**
 * The decisions use cases (server only): what a chair or an author does with a decision.
 * Each calls lib/dal for its reads and writes; the pure letter, template and comparison code
 * sits beside them in this folder and may be imported directly (also by client components).
 */
import "server-only";

export { compareVersions, type VersionComparison } from "./compare-versions";
export { checkLetter, createDecision, letterFilename, letterObjectKey, previewDecision, type DecisionPreview, type DecisionRequest } from "./issue";
export { getLetterTemplate, saveLetterTemplate } from "./letter-template";
export { decisionLetterUrl, getDecision, listProposalDecisions, type DecisionView } from "./read";
export { getDecisionWorkspace, type DecisionWorkspace, type WorkspaceCheck, type WorkspaceItem, type WorkspaceReview } from "./workspace";
