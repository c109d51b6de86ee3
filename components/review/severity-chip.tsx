// Severity of a review item, in words (never colour alone).
export type Severity = "major" | "minor" | "comment";

const STYLE: Record<Severity, string> = {
  major: "border-void-500 bg-void-100 text-void-700",
  minor: "border-drift-500 bg-drift-100 text-drift-700",
  comment: "border-ink-300 bg-ink-100 text-ink-700",
};

export const severityLabel: Record<Severity, string> = { major: "Major", minor: "Minor", comment: "Comment" };

export function SeverityChip({ severity }: { severity: Severity }) {
  return <span className={`inline-block rounded-chip border px-2 py-0.5 text-xs font-semibold ${STYLE[severity]}`}>{severityLabel[severity]}</span>;
}
