/**
 * The review report of one proposal version: what the panel scored, the review items and
 * what became of them, the server's orbit checks with the question each verdict answers,
 * and the changes since the previous version. Pure: lib/dal/reports.ts loads the data (and
 * applies the blind rules), `reportNodes` turns it into a small document model that the
 * HTML renderer (page and API) and the PDF renderer (lib/pdf/review-report.ts) share, so
 * both always carry the same sections.
 */
import { FILE_QUESTION } from "@/lib/orbit-files/compare";
import { CONSISTENT_MEANS } from "@/lib/orbit/labels";

/** Who the report is written for: it decides which names appear (see lib/dal/reports.ts). */
export const REPORT_AUDIENCES = ["chair", "reviewer", "proposer"] as const;
export type ReportAudience = (typeof REPORT_AUDIENCES)[number];

/** The three questions a board asks of the numbers; every verdict says which one it answers. */
export const NUMBERS_QUESTION = "Are the numbers right?";
export const CLOSES_QUESTION = "Does the mission close?";
export { FILE_QUESTION };

export interface ReportCriterion {
  id: string;
  title: string;
  weight: number;
  scaleMin: number;
  scaleMax: number;
}

export interface ReportReview {
  /** As the reader may see it: "Reviewer 2 · Ada Quill" for the chair, "Reviewer 2" for proposers. */
  reviewerLabel: string;
  weightedTotal: number | null;
  /** criterion id → score (null: not scored). */
  scores: Record<string, number | null>;
  summary: string;
  /** The reviewer's confidence and expertise (chair's reports only; null when not stated). */
  confidence: string | null;
  expertise: string | null;
  /** Set when the score lies more than 2 standard deviations from the other reviewers' (the panel's outlier flag). */
  flag: string | null;
}

export interface ReportScores {
  criteria: ReportCriterion[];
  /** Submitted reviews only. */
  reviews: ReportReview[];
  assigned: number;
  /** Per criterion: the mean of the submitted scores and, when the panel's calibration is available, the calibrated mean. */
  perCriterion: {
    criterionId: string;
    title: string;
    weight: number;
    rawMean: number | null;
    min: number | null;
    max: number | null;
    calibratedMean: number | null;
  }[];
  overall: { rawMean: number | null; spread: number | null; calibratedMean: number | null };
  /**
   * The calibration across the call (reviewer leniency removed), or null when the product
   * has no calibration to offer: the report then shows raw figures only and says so.
   */
  calibration: { method: string; note: string | null; proposals: number } | null;
}

export interface ReportItem {
  severity: "major" | "minor" | "comment";
  title: string;
  body: string;
  status: string;
  authorLabel: string;
  createdAt: string;
  /** Replies in the item's discussion, oldest first. */
  replies: { authorLabel: string; body: string; createdAt: string }[];
  /** The proposers' answer in the response round (null: not answered). */
  answer: { authorLabel: string; body: string; updatedAt: string; /** "version 2, section “Mission design”" */ pointsAt: string | null } | null;
  /** What became of the item, oldest first: the last one stands. */
  dispositions: { label: string; reason: string; actorLabel: string; createdAt: string }[];
}

export interface ReportCheckRow {
  quantity: string;
  claimed: string;
  computed: string;
  allowance: string;
  verdict: "within" | "outside" | "not checked";
  hint: string | null;
}

export interface ReportCheck {
  label: string;
  kind: string;
  status: "consistent" | "inconsistent" | "invalid";
  rows: ReportCheckRow[];
  messages: string[];
  /** "checked at 0.1 %, angles 0.05°" (null before the policy was recorded). */
  policy: string | null;
}

export interface ReportRequirement {
  claimLabel: string;
  title: string;
  status: "met" | "notMet" | "notEvaluated";
  reason: string;
}

export interface ReportChanges {
  previousNumber: number;
  wordsAdded: number;
  wordsRemoved: number;
  /** True when the reader may not read the previous version: only the counts are shown. */
  withheld: boolean;
  /** Changed passages of the text, in order (long ones cut); `more` counts those left out. */
  passages: { kind: "added" | "removed"; text: string }[];
  more: number;
  /** Orbit claims that changed (added, removed, new verdict, new values). */
  claims: { label: string; change: string; details: string[] }[];
  unchangedClaims: number;
}

export interface ReviewReport {
  audience: ReportAudience;
  generatedAt: string;
  board: { name: string };
  call: { title: string };
  proposal: { title: string; missionType: string; /** null when the board hides proposers' names from this reader. */ proposerName: string | null };
  version: { number: number; submittedAt: string; latest: boolean };
  decision: { outcomeLabel: string; decidedAt: string } | null;
  scores: ReportScores;
  items: ReportItem[];
  checks: ReportCheck[];
  fileChecks: ReportCheck[];
  requirements: ReportRequirement[];
  /** null for version 1. */
  changes: ReportChanges | null;
  notice: string;
}

// ---------------------------------------------------------------------------------------
// The document model both renderers draw

export type ReportNode =
  | { type: "heading"; level: 2 | 3; text: string; id?: string }
  | { type: "paragraph"; text: string; tone?: "muted" | "caution" | "strong" }
  | { type: "facts"; pairs: [string, string][] }
  | { type: "table"; caption: string; columns: string[]; rows: string[][]; numeric?: number[] }
  | { type: "list"; items: string[] };

/** Section titles, in order (tests look for them in the HTML and in the PDF's text). */
export const REPORT_SECTIONS = {
  scores: "Scores by criterion",
  items: "Review items",
  checks: "Orbit checks",
  changes: "Changes since the previous version",
} as const;

export const SEVERITY_LABELS = { major: "major", minor: "minor", comment: "comment" } as const;
const STATUS_LABELS = { consistent: "consistent", inconsistent: "inconsistent", invalid: "cannot be evaluated" } as const;
const REQUIREMENT_LABELS = { met: "met", notMet: "not met", notEvaluated: "not evaluated" } as const;

export function formatScore(n: number | null | undefined, digits = 2): string {
  return n === null || n === undefined || !Number.isFinite(n) ? "—" : n.toFixed(digits);
}

/** A figure as a person reads it: integers as they are, others to 6 significant digits. */
export function formatFigure(value: unknown): string {
  if (typeof value === "number") return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(6)));
  if (typeof value === "string") return value;
  if (typeof value === "boolean") return value ? "yes" : "no";
  if (Array.isArray(value)) return value.map(formatFigure).join(", ");
  return "—";
}

const AUDIENCE_NOTE: Record<ReportAudience, string> = {
  chair: "Written for the chair: reviewers are named.",
  reviewer: "Written for a reviewer of this version: the other reviewers are numbered, not named.",
  proposer: "Written for the proposers: reviewers are numbered, not named.",
};

function scoreNodes(report: ReviewReport): ReportNode[] {
  const s = report.scores;
  const nodes: ReportNode[] = [{ type: "heading", level: 2, text: REPORT_SECTIONS.scores, id: "scores" }];
  nodes.push({
    type: "paragraph",
    text: `${s.reviews.length} of ${s.assigned} assigned ${s.assigned === 1 ? "review" : "reviews"} submitted. Mean weighted total (raw): ${formatScore(
      s.overall.rawMean,
    )}; spread (sample standard deviation): ${formatScore(s.overall.spread)}${
      s.calibration ? `; calibrated mean: ${formatScore(s.overall.calibratedMean)}` : ""
    }.`,
  });
  if (s.calibration) {
    nodes.push({ type: "paragraph", tone: "muted", text: `Calibrated: ${s.calibration.method}${s.calibration.note ? ` ${s.calibration.note}` : ""}` });
  }
  const withCalibrated = Boolean(s.calibration);
  nodes.push({
    type: "table",
    caption: "Scores by criterion, raw" + (withCalibrated ? " and calibrated" : ""),
    columns: ["Criterion", "Weight (%)", "Scale", "Raw mean", "Lowest", "Highest", ...(withCalibrated ? ["Calibrated mean"] : [])],
    numeric: withCalibrated ? [1, 3, 4, 5, 6] : [1, 3, 4, 5],
    rows: s.perCriterion.map((c) => {
      const crit = s.criteria.find((x) => x.id === c.criterionId);
      return [
        c.title,
        formatFigure(c.weight),
        crit ? `${crit.scaleMin}–${crit.scaleMax}` : "—",
        formatScore(c.rawMean),
        formatScore(c.min, 0),
        formatScore(c.max, 0),
        ...(withCalibrated ? [formatScore(c.calibratedMean)] : []),
      ];
    }),
  });
  if (s.reviews.length) {
    const stated = s.reviews.some((r) => r.confidence !== null || r.expertise !== null);
    const flagged = s.reviews.some((r) => r.flag !== null);
    nodes.push({
      type: "table",
      caption: "Raw scores per review",
      columns: ["Reviewer", ...s.criteria.map((c) => c.title), "Weighted total", ...(stated ? ["Confidence", "Expertise"] : []), ...(flagged ? ["Flag"] : [])],
      numeric: [...s.criteria.map((_, i) => i + 1), s.criteria.length + 1],
      rows: s.reviews.map((r) => [
        r.reviewerLabel,
        ...s.criteria.map((c) => formatScore(r.scores[c.id] ?? null, 0)),
        formatScore(r.weightedTotal),
        ...(stated ? [r.confidence ?? "not stated", r.expertise ?? "not stated"] : []),
        ...(flagged ? [r.flag ?? ""] : []),
      ]),
    });
    for (const r of s.reviews) if (r.summary.trim()) nodes.push({ type: "paragraph", text: `${r.reviewerLabel}: ${r.summary.trim()}` });
  } else {
    nodes.push({ type: "paragraph", tone: "muted", text: "No review of this version has been submitted." });
  }
  return nodes;
}

function itemNodes(report: ReviewReport, dateText: (iso: string) => string): ReportNode[] {
  const nodes: ReportNode[] = [{ type: "heading", level: 2, text: REPORT_SECTIONS.items, id: "items" }];
  if (!report.items.length) {
    nodes.push({ type: "paragraph", tone: "muted", text: "No review items were raised on this version." });
    return nodes;
  }
  const open = report.items.filter((i) => i.status === "open").length;
  const answered = report.items.filter((i) => i.answer).length;
  const disposed = report.items.filter((i) => i.dispositions.length).length;
  nodes.push({
    type: "paragraph",
    text: `${report.items.length} ${report.items.length === 1 ? "item" : "items"}, ${open} still open; ${answered} answered by the proposers, ${disposed} with a disposition.`,
  });
  report.items.forEach((item, i) => {
    nodes.push({ type: "heading", level: 3, text: `${i + 1}. [${SEVERITY_LABELS[item.severity]}] ${item.title}` });
    const standing = item.dispositions[item.dispositions.length - 1];
    nodes.push({
      type: "facts",
      pairs: [
        ["Raised by", `${item.authorLabel}, ${dateText(item.createdAt)}`],
        ["Status", item.status],
        ["Disposition", standing ? `${standing.label}${standing.reason ? ` — ${standing.reason}` : ""}` : "none yet"],
      ],
    });
    nodes.push({ type: "paragraph", text: item.body });
    if (item.answer) {
      nodes.push({
        type: "paragraph",
        tone: "strong",
        text: `Answer by ${item.answer.authorLabel}, ${dateText(item.answer.updatedAt)}${item.answer.pointsAt ? ` (points at ${item.answer.pointsAt})` : ""}:`,
      });
      nodes.push({ type: "paragraph", text: item.answer.body });
    } else nodes.push({ type: "paragraph", tone: "muted", text: "No answer from the proposers." });
    if (item.dispositions.length) {
      nodes.push({
        type: "table",
        caption: `Disposition history of item ${i + 1}`,
        columns: ["When", "Who", "Disposition", "Why"],
        rows: item.dispositions.map((d) => [dateText(d.createdAt), d.actorLabel, d.label, d.reason]),
      });
    }
    if (item.replies.length) {
      nodes.push({
        type: "table",
        caption: `Discussion of item ${i + 1}`,
        columns: ["When", "Who", "Reply"],
        rows: item.replies.map((r) => [dateText(r.createdAt), r.authorLabel, r.body]),
      });
    }
  });
  return nodes;
}

function checkTable(check: ReportCheck, question: string): ReportNode[] {
  const nodes: ReportNode[] = [
    { type: "heading", level: 3, text: `${check.label || check.kind} (${check.kind})` },
    {
      type: "paragraph",
      tone: check.status === "consistent" ? undefined : "strong",
      text: `Verdict: ${STATUS_LABELS[check.status]}. Answers: ${question}${check.policy ? ` The call's checks ran ${check.policy}.` : ""}`,
    },
  ];
  if (check.rows.length) {
    nodes.push({
      type: "table",
      caption: `${check.label || check.kind}: claimed and recomputed values`,
      columns: ["Quantity", "Claimed", "Recomputed", "Allowed", "Result", "Likely slip"],
      numeric: [1, 2],
      rows: check.rows.map((r) => [r.quantity, r.claimed, r.computed, r.allowance, r.verdict === "outside" ? "outside — flagged" : r.verdict, r.hint ?? ""]),
    });
  }
  if (check.messages.length) nodes.push({ type: "list", items: check.messages });
  return nodes;
}

function checkNodes(report: ReviewReport): ReportNode[] {
  const nodes: ReportNode[] = [{ type: "heading", level: 2, text: REPORT_SECTIONS.checks, id: "checks" }];
  nodes.push({ type: "paragraph", tone: "caution", text: report.notice });
  const flagged = report.checks.filter((c) => c.status !== "consistent").length;
  nodes.push({ type: "heading", level: 3, text: `${NUMBERS_QUESTION} Orbit-check verdicts` });
  nodes.push({ type: "paragraph", tone: "muted", text: CONSISTENT_MEANS });
  if (report.checks.length) {
    nodes.push({
      type: "paragraph",
      text: `${report.checks.length} orbit-check ${report.checks.length === 1 ? "claim" : "claims"} recomputed by the server, ${flagged} flagged.`,
    });
    for (const c of report.checks) nodes.push(...checkTable(c, NUMBERS_QUESTION));
  } else nodes.push({ type: "paragraph", tone: "muted", text: "This version states no orbit-check claims." });

  nodes.push({ type: "heading", level: 3, text: `${CLOSES_QUESTION} Requirement verdicts` });
  if (report.requirements.length) {
    const notMet = report.requirements.filter((r) => r.status === "notMet").length;
    nodes.push({
      type: "paragraph",
      text: `${report.requirements.length} requirement ${report.requirements.length === 1 ? "verdict" : "verdicts"}, ${notMet} not met.`,
    });
    nodes.push({
      type: "table",
      caption: "Requirement verdicts (each answers: Does the mission close?)",
      columns: ["Requirement", "Claim", "Verdict", "Why", "Answers"],
      rows: report.requirements.map((r) => [r.title, r.claimLabel, REQUIREMENT_LABELS[r.status], r.reason, CLOSES_QUESTION]),
    });
  } else nodes.push({ type: "paragraph", tone: "muted", text: "The call set no requirement that concerns this version's claims." });

  nodes.push({ type: "heading", level: 3, text: `${FILE_QUESTION} File comparisons` });
  if (report.fileChecks.length) for (const c of report.fileChecks) nodes.push(...checkTable(c, FILE_QUESTION));
  else nodes.push({ type: "paragraph", tone: "muted", text: "No named orbit of this version is linked to an attached orbit file." });
  return nodes;
}

const CHANGE_LABELS: Record<string, string> = {
  added: "added",
  removed: "removed",
  "verdict-changed": "verdict changed",
  "values-changed": "values changed",
  unchanged: "unchanged",
};

export function changeLabel(change: string): string {
  return CHANGE_LABELS[change] ?? change;
}

function changeNodes(report: ReviewReport): ReportNode[] {
  const nodes: ReportNode[] = [{ type: "heading", level: 2, text: REPORT_SECTIONS.changes, id: "changes" }];
  const c = report.changes;
  if (!c) {
    nodes.push({ type: "paragraph", tone: "muted", text: "This is the first version: there is no previous version to compare with." });
    return nodes;
  }
  nodes.push({
    type: "paragraph",
    text: `Compared with version ${c.previousNumber}: ${c.wordsAdded} ${c.wordsAdded === 1 ? "word" : "words"} added, ${c.wordsRemoved} removed; ${c.claims.length} orbit ${
      c.claims.length === 1 ? "claim" : "claims"
    } changed, ${c.unchangedClaims} unchanged.`,
  });
  if (c.withheld) {
    nodes.push({ type: "paragraph", tone: "muted", text: `You may not read version ${c.previousNumber}, so only the counts of what changed are shown.` });
    return nodes;
  }
  if (c.claims.length) {
    nodes.push({
      type: "table",
      caption: `Orbit claims changed since version ${c.previousNumber}`,
      columns: ["Claim", "Change", "Details"],
      rows: c.claims.map((x) => [x.label, changeLabel(x.change), x.details.join("; ")]),
    });
  }
  if (c.passages.length) {
    nodes.push({
      type: "table",
      caption: `Text changed since version ${c.previousNumber}`,
      columns: ["Change", "Text"],
      rows: c.passages.map((p) => [p.kind === "added" ? "added" : "removed", p.text]),
    });
    if (c.more > 0)
      nodes.push({ type: "paragraph", tone: "muted", text: `${c.more} further changed passages are left out here; the comparison page shows them all.` });
  }
  return nodes;
}

/** The report as document nodes, in the order both renderers draw them. */
export function reportNodes(report: ReviewReport, dateText: (iso: string) => string): ReportNode[] {
  const facts: [string, string][] = [
    ["Board", report.board.name],
    ["Call", report.call.title],
    ["Proposal", report.proposal.title],
    ["Mission type", report.proposal.missionType],
  ];
  if (report.proposal.proposerName !== null) facts.push(["Proposer", report.proposal.proposerName]);
  facts.push([
    "Version",
    `${report.version.number}, submitted ${dateText(report.version.submittedAt)}${report.version.latest ? "" : " (a later version exists)"}`,
  ]);
  facts.push(["Decision", report.decision ? `${report.decision.outcomeLabel}, ${dateText(report.decision.decidedAt)}` : "not decided yet"]);
  facts.push(["Report made", dateText(report.generatedAt)]);
  return [
    { type: "facts", pairs: facts },
    { type: "paragraph", tone: "muted", text: AUDIENCE_NOTE[report.audience] },
    ...scoreNodes(report),
    ...itemNodes(report, dateText),
    ...checkNodes(report),
    ...changeNodes(report),
  ];
}

export function reportTitle(report: Pick<ReviewReport, "proposal" | "version">): string {
  return `Review report: ${report.proposal.title}, version ${report.version.number}`;
}

export function reportFilename(title: string, versionNumber: number): string {
  const slug = title
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 60);
  return `review-report-${slug || "proposal"}-v${versionNumber}.pdf`;
}
