/** `lifetime`: orbital lifetime under atmospheric drag (method and sources in ../decay.ts and ../atmosphere.ts). */
import { decayOrbit } from "../decay";
import type { KindDef } from "./types";
import { DRAG_GIVEN, DRAG_RULE, evaluation, readBallisticCoefficient, readClosedOrbit, readSolarActivity, requireEarth, SHAPE_GIVEN_CHOICES } from "./shared";

export const lifetimeKind: KindDef = {
  summary: "orbital lifetime under atmospheric drag until the perigee falls below 100 km",
  givenRule: `the orbit (altitude, or two shape values such as periapsisAltitude and apoapsisAltitude) and ${DRAG_RULE}`,
  given: [...SHAPE_GIVEN_CHOICES, ...DRAG_GIVEN],
  computed: ["lifetimeYears", "reentered", "ballisticCoefficient", "decayProfile"],
  evaluate(g, body) {
    requireEarth(body, "lifetime");
    const c = readClosedOrbit(g, body);
    const B = readBallisticCoefficient(g);
    const activity = readSolarActivity(g);
    const d = decayOrbit({ mu: body.mu, radius: body.radius, a: c.a, e: c.e, ballisticCoefficient: B, solarActivity: activity });
    const messages = [
      `exponential atmosphere, ${activity} solar activity, ballistic coefficient ${B.toFixed(1)} kg/m²`,
      ...(d.reentered ? [] : [`the orbit does not decay within ${d.lifetimeYears.toFixed(0)} years: the lifetime is longer than that`]),
    ];
    return evaluation(
      { lifetimeYears: d.lifetimeYears, reentered: d.reentered, ballisticCoefficient: B, decayProfile: d.profile as unknown as Record<string, number>[] },
      body,
      messages,
    );
  },
};
