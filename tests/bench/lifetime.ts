/**
 * Lifetime solves per second (drag decay to a 100 km perigee), over a spread of orbits and
 * ballistic coefficients; the goal is under 5 ms per solve.
 */
import { decayOrbit } from "../../lib/orbit/decay";
import { defaultBody } from "../../lib/orbit/constants";

export function benchLifetime(): void {
  const { mu, radius } = defaultBody("earth");
  const cases: { hp: number; ha: number; B: number; activity: "low" | "mean" | "high" }[] = [];
  for (const hp of [250, 350, 450, 550, 650, 750])
    for (const extra of [0, 300])
      for (const B of [20, 60, 150]) for (const activity of ["low", "mean", "high"] as const) cases.push({ hp, ha: hp + extra, B, activity });
  const solve = (c: (typeof cases)[number]) => {
    const rp = radius + c.hp;
    const ra = radius + c.ha;
    return decayOrbit({ mu, radius, a: (rp + ra) / 2, e: (ra - rp) / (ra + rp), ballisticCoefficient: c.B, solarActivity: c.activity });
  };
  for (const c of cases) solve(c);
  let best = Infinity;
  let worst = 0;
  let steps = 0;
  for (let round = 0; round < 3; round++) {
    const t0 = performance.now();
    for (const c of cases) {
      const s0 = performance.now();
      steps += solve(c).steps;
      worst = Math.max(worst, performance.now() - s0);
    }
    best = Math.min(best, performance.now() - t0);
  }
  const perSolve = best / cases.length;
  console.log("");
  console.log(`Orbital lifetime (${cases.length} orbits: perigee 250–750 km, circular and 300 km eccentric, B 20–150 kg/m², three solar levels)`);
  console.log(
    `  lifetime solves/s: ${(1000 / perSolve).toFixed(0)}   mean ${perSolve.toFixed(3)} ms per solve, slowest ${worst.toFixed(3)} ms, ${Math.round(steps / 3 / cases.length)} steps on average`,
  );
  console.log(
    `  goal: < 5 ms per solve (mean of the best round) → ${perSolve < 5 ? "met" : "NOT met"} (the slowest single solve includes scheduling on a shared machine)`,
  );
}
