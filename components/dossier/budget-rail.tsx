// The rail's budget view: the call's requirements judged live on the dossier's own blocks
// (words first, colour repeats them), a Δv waterfall by phase and a lifetime decay curve.
// Both charts are SVG with a title, a description and the figures in text beside them.
import type { BlockEvaluation, DeltaVBudget } from "@/lib/dossier/claims";
import { judgeBlocks, missingClaims } from "@/lib/dossier/requirements";
import { requirementType, type CallRequirement, type RequirementOutcome } from "@/lib/requirements";
import { RequirementBadge, RequirementRowLine } from "./requirement-flags";

export interface RailRequirement extends CallRequirement {
  summary: string;
}

function requirementsView(evaluations: readonly BlockEvaluation[], requirements: readonly RailRequirement[]) {
  const byBlock = judgeBlocks(evaluations, requirements);
  const per = new Map<string, { label: string; outcome: RequirementOutcome }[]>();
  for (const ev of evaluations)
    for (const o of byBlock[ev.block.blockId] ?? [])
      per.set(o.requirementId, [...(per.get(o.requirementId) ?? []), { label: ev.block.label || ev.block.claim.kind, outcome: o }]);
  const missing = new Set(missingClaims(evaluations, requirements).map((r) => r.id));
  return { per, missing };
}

export function BudgetRail({
  evaluations,
  requirements,
  budget,
}: {
  evaluations: readonly BlockEvaluation[];
  requirements: readonly RailRequirement[];
  budget: DeltaVBudget;
}) {
  const { per, missing } = requirementsView(evaluations, requirements);
  const decay = evaluations.find(
    (e) => (e.block.claim.kind === "disposal" || e.block.claim.kind === "lifetime") && Array.isArray(e.result.computed.decayProfile),
  );
  const deadline = requirements.find((r) => r.type === "disposalDeadline")?.params.years;
  return (
    <section aria-labelledby="requirements-heading" className="space-y-4 rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
      <div>
        <h2 id="requirements-heading" className="text-base font-semibold text-ink-900">
          Call requirements (live)
        </h2>
        {requirements.length === 0 ? (
          <p className="text-xs text-ink-600">This call sets no requirements on budgets, disposal or eclipses.</p>
        ) : (
          <ul className="mt-2 space-y-3">
            {requirements.map((r) => {
              const judged = per.get(r.id) ?? [];
              return (
                <li key={r.id} data-rail-requirement={r.type} className="text-sm">
                  <p className="font-semibold text-ink-900">{r.summary}</p>
                  <p className="text-xs text-ink-600">{r.rationale}</p>
                  {missing.has(r.id) ? (
                    <p className="mt-1 text-xs">
                      <RequirementBadge status="notEvaluated" /> no claim addresses it yet: add a {requirementType(r.type)?.kinds.join(" or ")} block.
                    </p>
                  ) : (
                    <ul className="mt-1 space-y-1">
                      {judged.map(({ label, outcome }) => (
                        <li key={label + outcome.status} className="text-xs text-ink-800" data-rail-outcome={outcome.status}>
                          <RequirementBadge status={outcome.status} /> <span className="font-semibold">{label}</span>: {outcome.reason}
                          {outcome.rows.length > 0 ? (
                            <ul className="ml-3 mt-0.5">
                              {outcome.rows.map((row) => (
                                <RequirementRowLine key={row.label} row={row} />
                              ))}
                            </ul>
                          ) : null}
                        </li>
                      ))}
                    </ul>
                  )}
                </li>
              );
            })}
          </ul>
        )}
      </div>
      <MassLink evaluations={evaluations} />
      {budget.maneuvers.length > 0 && budget.required > 0 ? <DeltaVWaterfall budget={budget} /> : null}
      {decay ? (
        <DecayCurve
          label={decay.block.label || decay.block.claim.kind}
          profile={decay.result.computed.decayProfile as unknown as DecayPoint[]}
          deadlineYears={typeof deadline === "number" ? deadline : undefined}
        />
      ) : null}
    </section>
  );
}

const W = 260;
const H = 150;
const PAD = { left: 40, right: 8, top: 8, bottom: 28 };

/** Cumulative Δv by entry (phase or manoeuvre), then the total required against the available. */
export function DeltaVWaterfall({ budget }: { budget: DeltaVBudget }) {
  const bars = budget.maneuvers;
  const top = Math.max(budget.required, budget.available ?? 0) * 1.05;
  const n = bars.length + 2;
  const bw = (W - PAD.left - PAD.right) / n;
  const y = (v: number) => PAD.top + (H - PAD.top - PAD.bottom) * (1 - v / top);
  const cumulative = bars.map((_, i) => bars.slice(0, i + 1).reduce((sum, b) => sum + b.deltaV, 0));
  const text = `${bars.map((b) => `${b.label} ${b.deltaV.toFixed(3)} km/s`).join("; ")}; required ${budget.required.toFixed(3)} km/s; available ${
    budget.available !== null ? `${budget.available.toFixed(3)} km/s` : "not stated"
  }.`;
  return (
    <figure className="space-y-1">
      <figcaption className="text-sm font-semibold text-ink-900">Δv waterfall ({budget.propulsionLabel ?? "maneuver blocks"})</figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-labelledby="dv-waterfall-title dv-waterfall-desc" className="w-full" data-chart="dv-waterfall">
        <title id="dv-waterfall-title">Δv waterfall by phase</title>
        <desc id="dv-waterfall-desc">{text}</desc>
        <line x1={PAD.left} x2={W - PAD.right} y1={y(0)} y2={y(0)} className="stroke-ink-300" />
        <text x={PAD.left - 4} y={y(top / 1.05) + 4} textAnchor="end" className="fill-ink-600 text-[8px]">
          {(top / 1.05).toFixed(2)}
        </text>
        <text x={PAD.left - 4} y={y(0) + 3} textAnchor="end" className="fill-ink-600 text-[8px]">
          0 km/s
        </text>
        {bars.map((b, i) => {
          const from = i === 0 ? 0 : cumulative[i - 1]!;
          const to = cumulative[i]!;
          return (
            <rect key={b.blockId} x={PAD.left + i * bw + 2} width={bw - 4} y={y(to)} height={Math.max(0.5, y(from) - y(to))} className="fill-trajectory-500" />
          );
        })}
        <rect x={PAD.left + bars.length * bw + 2} width={bw - 4} y={y(budget.required)} height={y(0) - y(budget.required)} className="fill-ink-700" />
        {budget.available !== null ? (
          <rect
            x={PAD.left + (bars.length + 1) * bw + 2}
            width={bw - 4}
            y={y(budget.available)}
            height={y(0) - y(budget.available)}
            className={budget.available >= budget.required ? "fill-holds-500" : "fill-void-500"}
          />
        ) : null}
        <text x={PAD.left + bars.length * bw + bw / 2} y={H - 14} textAnchor="middle" className="fill-ink-700 text-[8px]">
          required
        </text>
        <text x={PAD.left + (bars.length + 1) * bw + bw / 2} y={H - 14} textAnchor="middle" className="fill-ink-700 text-[8px]">
          available
        </text>
        <text x={PAD.left + (bars.length * bw) / 2} y={H - 14} textAnchor="middle" className="fill-ink-700 text-[8px]">
          phases, in order
        </text>
      </svg>
      <p className="text-2xs text-ink-600">{text}</p>
    </figure>
  );
}

export interface DecayPoint {
  years: number;
  periapsisAltitude: number;
  apoapsisAltitude: number;
}

/** Perigee and apogee altitude against years, with the disposal deadline when the call sets one. */
export function DecayCurve({ label, profile, deadlineYears }: { label: string; profile: DecayPoint[]; deadlineYears?: number }) {
  if (profile.length < 2) return null;
  const end = profile[profile.length - 1]!.years;
  const tMax = Math.max(end, deadlineYears ?? 0) * 1.05 || 1;
  const hMax = Math.max(...profile.map((p) => p.apoapsisAltitude)) * 1.05;
  const x = (t: number) => PAD.left + (W - PAD.left - PAD.right) * (t / tMax);
  const y = (h: number) => PAD.top + (H - PAD.top - PAD.bottom) * (1 - h / hMax);
  const line = (key: "periapsisAltitude" | "apoapsisAltitude") => profile.map((p) => `${x(p.years).toFixed(1)},${y(p[key]).toFixed(1)}`).join(" ");
  const first = profile[0]!;
  const text = `${label}: perigee ${first.periapsisAltitude.toFixed(0)} km and apogee ${first.apoapsisAltitude.toFixed(0)} km at the start; the perigee falls below 100 km after ${end.toFixed(1)} years${
    deadlineYears !== undefined ? `; the call's deadline is ${deadlineYears} years` : ""
  }.`;
  return (
    <figure className="space-y-1">
      <figcaption className="text-sm font-semibold text-ink-900">Lifetime: altitude against years</figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-labelledby="decay-title decay-desc" className="w-full" data-chart="decay-curve">
        <title id="decay-title">Orbital decay of {label}</title>
        <desc id="decay-desc">{text}</desc>
        <line x1={PAD.left} x2={W - PAD.right} y1={y(0)} y2={y(0)} className="stroke-ink-300" />
        <line x1={PAD.left} x2={PAD.left} y1={PAD.top} y2={y(0)} className="stroke-ink-300" />
        <polyline points={line("apoapsisAltitude")} fill="none" className="stroke-ink-500" strokeDasharray="3 2" />
        <polyline points={line("periapsisAltitude")} fill="none" className="stroke-trajectory-600" strokeWidth={1.5} />
        {deadlineYears !== undefined ? (
          <g>
            <line x1={x(deadlineYears)} x2={x(deadlineYears)} y1={PAD.top} y2={y(0)} className="stroke-void-500" strokeDasharray="4 2" />
            <text x={x(deadlineYears) - 2} y={PAD.top + 8} textAnchor="end" className="fill-void-700 text-[8px]">
              deadline {deadlineYears} y
            </text>
          </g>
        ) : null}
        <text x={PAD.left - 4} y={y(hMax / 1.05) + 3} textAnchor="end" className="fill-ink-600 text-[8px]">
          {(hMax / 1.05).toFixed(0)} km
        </text>
        <text x={PAD.left - 4} y={y(0) + 3} textAnchor="end" className="fill-ink-600 text-[8px]">
          0
        </text>
        <text x={W - PAD.right} y={H - 14} textAnchor="end" className="fill-ink-600 text-[8px]">
          {(tMax / 1.05).toFixed(1)} years
        </text>
        <text x={PAD.left + 2} y={H - 4} className="fill-ink-600 text-[8px]">
          solid: perigee; dashed: apogee
        </text>
      </svg>
      <p className="text-2xs text-ink-600">{text}</p>
    </figure>
  );
}

/** The mass budget's wet mass against the Δv budget's initial mass: the two must describe one spacecraft. */
function MassLink({ evaluations }: { evaluations: readonly BlockEvaluation[] }) {
  const mass = evaluations.find((e) => e.block.claim.kind === "massBudget" && typeof e.result.computed.wetMass === "number");
  const dv = evaluations.find((e) => e.block.claim.kind === "deltaVBudget" && typeof e.claim.given.initialMass === "number");
  if (!mass || !dv) return null;
  const wet = mass.result.computed.wetMass as number;
  const initial = dv.claim.given.initialMass as number;
  const apart = Math.abs(wet - initial) / initial;
  const same = apart <= 0.01;
  return (
    <p data-mass-link={same ? "agrees" : "differs"} className={`text-xs ${same ? "text-holds-700" : "text-drift-700"}`}>
      Mass budget wet mass {wet.toFixed(1)} kg {same ? "agrees with" : `differs by ${(apart * 100).toFixed(1)} % from`} the Δv budget&apos;s initial mass{" "}
      {initial.toFixed(1)} kg
      {same ? "." : ": the two budgets should describe the same spacecraft."}
    </p>
  );
}
