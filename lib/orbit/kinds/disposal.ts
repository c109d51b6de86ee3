/**
 * `disposal`: a perigee-lowering burn at apogee from the mission orbit to a target perigee,
 * and the lifetime that follows (or, without a target perigee, the natural lifetime).
 */
import { STANDARD_GRAVITY_KM_S2 } from "../constants";
import { visViva } from "../conics";
import { decayOrbit, REENTRY_PERIGEE_KM } from "../decay";
import { fail, fmt } from "../errors";
import type { KindDef } from "./types";
import { DRAG_GIVEN, DRAG_RULE, evaluation, readBallisticCoefficient, readClosedOrbit, readSolarActivity, requireEarth, SHAPE_GIVEN_CHOICES } from "./shared";

export const disposalKind: KindDef = {
  summary: "end-of-life disposal: a perigee-lowering burn (or none) and the lifetime against a deadline",
  givenRule: `the mission orbit (altitude, or two shape values), optional targetPerigeeAltitude (km; omit for no burn), ${DRAG_RULE}, optional deadlineYears, optional specificImpulse (s) with mass (kg) for the propellant`,
  given: [...SHAPE_GIVEN_CHOICES, ["targetPerigeeAltitude", "optional"], ...DRAG_GIVEN, ["deadlineYears", "optional"], ["specificImpulse", "optional"]],
  computed: ["deltaV", "lifetimeYears", "naturalLifetimeYears", "reentered", "deadlineMet", "propellantMass", "ballisticCoefficient", "decayProfile"],
  evaluate(g, body) {
    requireEarth(body, "disposal");
    const c = readClosedOrbit(g, body);
    const B = readBallisticCoefficient(g);
    const activity = readSolarActivity(g);
    const R = body.radius;
    const rp = c.a * (1 - c.e);
    const ra = c.a * (1 + c.e);
    const messages: string[] = [];
    const natural = decayOrbit({ mu: body.mu, radius: R, a: c.a, e: c.e, ballisticCoefficient: B, solarActivity: activity });
    let deltaV = 0;
    let after = natural;
    let reenteredAtOnce = false;
    if (g.has("targetPerigeeAltitude")) {
      const hpTarget = g.num("targetPerigeeAltitude");
      const rpTarget = R + hpTarget;
      if (!(rpTarget < rp))
        fail(
          `given.targetPerigeeAltitude (${fmt(hpTarget)} km) must be below the mission orbit's perigee (${fmt(rp - R)} km): a disposal burn lowers the perigee`,
        );
      if (!(hpTarget > 0)) fail("given.targetPerigeeAltitude must be above the surface (more than 0 km)");
      // Burn at apogee, vis-viva before v = √(μ(2/ra − 1/a)) and after with a' = (ra + rp')/2: Vallado, "Fundamentals of Astrodynamics and Applications" (4th ed.), ch. 6, coplanar transfers (recalled from memory).
      const aNew = (ra + rpTarget) / 2;
      deltaV = visViva(body.mu, ra, c.a) - visViva(body.mu, ra, aNew);
      if (hpTarget < REENTRY_PERIGEE_KM) {
        reenteredAtOnce = true;
        after = { lifetimeYears: 0, reentered: true, profile: [{ years: 0, periapsisAltitude: hpTarget, apoapsisAltitude: ra - R }], steps: 0 };
        messages.push(`the target perigee is below ${REENTRY_PERIGEE_KM} km: re-entry follows the burn directly (within the first revolution)`);
      } else {
        // e = (ra − rp)/(ra + rp): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical orbits (recalled from memory).
        const eNew = (ra - rpTarget) / (ra + rpTarget);
        after = decayOrbit({ mu: body.mu, radius: R, a: aNew, e: eNew, ballisticCoefficient: B, solarActivity: activity });
      }
    } else {
      messages.push("no disposal burn: the natural lifetime is judged");
    }
    const values: Record<string, import("../schema").ComputedValue> = {
      deltaV,
      lifetimeYears: after.lifetimeYears,
      naturalLifetimeYears: natural.lifetimeYears,
      reentered: after.reentered,
      ballisticCoefficient: B,
      decayProfile: after.profile as unknown as Record<string, number>[],
    };
    if (!after.reentered) messages.push(`the orbit does not decay within ${after.lifetimeYears.toFixed(0)} years`);
    if (g.has("deadlineYears")) {
      const deadline = g.num("deadlineYears");
      if (!(deadline > 0)) fail(`given.deadlineYears must be more than 0 years (got ${fmt(deadline)})`);
      values.deadlineMet = after.reentered && after.lifetimeYears <= deadline;
    }
    if (g.has("specificImpulse")) {
      const isp = g.num("specificImpulse", "positive");
      if (!g.has("mass")) fail("give mass (kg) with specificImpulse to compute the disposal propellant");
      const m = g.num("mass", "positive");
      // Rocket equation mp = m0(1 − e^(−Δv/(Isp·g0))): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 11, the rocket equation (recalled from memory).
      values.propellantMass = m * (1 - Math.exp(-deltaV / (isp * STANDARD_GRAVITY_KM_S2)));
    }
    if (!reenteredAtOnce) messages.unshift(`exponential atmosphere, ${activity} solar activity, ballistic coefficient ${B.toFixed(1)} kg/m²`);
    return evaluation(values, body, messages);
  },
};
