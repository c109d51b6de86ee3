// Under the call overview: how the calibrated means were made, where the ranking changes,
// each reviewer's fitted leniency and the scores flagged as outlying (server component).
import { formatScore } from "@/components/review/api";
import { Panel } from "@/components/ui/panel";
import type { CalibrationView } from "@/lib/dal/meetings";

export function CalibrationNotes({ calibration }: { calibration: CalibrationView }) {
  const moved = calibration.proposals.filter((p) => p.rankNote);
  return (
    <Panel
      id="calibration"
      title="Calibration"
      description={`Calibrated mean: the mean of a proposal's weighted totals less its reviewers' fitted leniency. Each reviewer's leniency is an additive effect fitted across the call and shrunk toward zero (ridge, λ = ${calibration.lambda}), so a reviewer with few scores moves little. An aid for discussion, not a verdict.`}
    >
      <div className="grid gap-6 lg:grid-cols-3">
        <div>
          <h3 className="font-semibold">Rank changes</h3>
          {moved.length === 0 ? (
            <p className="text-sm text-ink-600">Calibration changes no proposal&apos;s rank.</p>
          ) : (
            <ul className="list-disc pl-5 text-sm">
              {moved.map((p) => (
                <li key={p.proposalId}>
                  {p.title}: {p.rankNote}
                </li>
              ))}
            </ul>
          )}
        </div>
        <div>
          <h3 className="font-semibold">Reviewer leniency (score units)</h3>
          {calibration.reviewers.length === 0 ? (
            <p className="text-sm text-ink-600">No submitted reviews yet.</p>
          ) : (
            <ul className="text-sm">
              {calibration.reviewers.map((r) => (
                <li key={r.reviewerId}>
                  {r.name}:{" "}
                  <span className="font-mono">
                    {r.effect >= 0 ? "+" : "−"}
                    {formatScore(Math.abs(r.effect))}
                  </span>{" "}
                  <span className="text-ink-600">({r.count} scored)</span>
                </li>
              ))}
            </ul>
          )}
        </div>
        <div>
          <h3 className="font-semibold">Outlying scores</h3>
          <p className="text-xs text-ink-600">More than 2 standard deviations from the other reviewers of the same proposal; for the panel to discuss.</p>
          {calibration.outliers.length === 0 ? (
            <p className="text-sm text-ink-600">None.</p>
          ) : (
            <ul className="list-disc pl-5 text-sm" data-outlying-scores="">
              {calibration.outliers.map((o) => (
                <li key={`${o.proposalId}:${o.reviewerId}`}>
                  {o.title}: {o.reviewerName} gave {formatScore(o.score)}, others {formatScore(o.othersMean)} (±{formatScore(o.othersSpread)})
                </li>
              ))}
            </ul>
          )}
        </div>
      </div>
    </Panel>
  );
}
