/** `j2Rates`: secular J2 drift of the node and periapsis. */
import { SECONDS_PER_DAY } from "../constants";
import { classify, period as periodOf } from "../conics";
import { fail, fmt } from "../errors";
import { j2SecularRates } from "../j2";
import { RAD } from "../vector";
import type { KindDef } from "./types";
import { SHAPE_GIVEN, SHAPE_RULE, readShape, plotOf, angleBetweenZeroAnd, result } from "./orbit-shape";

export const j2RatesKind: KindDef = {
  summary: "secular J2 drift of the node and periapsis",
  givenRule: `an orbit shape (${SHAPE_RULE}; one radius or altitude alone means circular) and inclination (deg)`,
  given: [...SHAPE_GIVEN, ["inclination", "required"]],
  computed: ["raanRate", "argPeriapsisRate", "period"],
  evaluate(g, body) {
    const { conic: c, messages } = readShape(g, body, true);
    const i = angleBetweenZeroAnd(g, "inclination", 180);
    if (!(c.e < 1) || classify(c.e) === "parabolic") fail(`J2 secular rates are computed for closed orbits only (e = ${fmt(c.e)})`);
    const rates = j2SecularRates(body.mu, body.j2ReferenceRadius, body.j2, c.a, c.e, i);
    const k = RAD * SECONDS_PER_DAY;
    return result({ raanRate: rates.raanRate * k, argPeriapsisRate: rates.argPeriapsisRate * k, period: periodOf(body.mu, c.a) }, body, {
      messages,
      conics: [plotOf("orbit", c)],
    });
  },
};
