/** `sunSynchronous`: inclination that makes the J2 nodal drift follow the mean sun. */
import { SECONDS_PER_DAY } from "../constants";
import { classify, period as periodOf } from "../conics";
import { fail, fmt } from "../errors";
import { inclinationForNodalRate } from "../j2";
import { DEG, RAD } from "../vector";
import type { KindDef } from "./types";
import { SHAPE_RULE, readShape, plotOf, result, SHAPE_GIVEN } from "./orbit-shape";

export const sunSynchronousKind: KindDef = {
  summary: "inclination that makes the J2 nodal drift follow the mean sun",
  givenRule: `an orbit shape (${SHAPE_RULE}; one radius or altitude alone means circular)`,
  given: SHAPE_GIVEN,
  computed: ["inclination", "raanRate", "period"],
  evaluate(g, body) {
    const { conic: c, messages } = readShape(g, body, true);
    if (!(c.e < 1) || classify(c.e) === "parabolic") fail(`a sun-synchronous orbit must be closed (e = ${fmt(c.e)})`);
    if (body.year === undefined)
      fail(
        `${body.name} has no orbital period about the sun in the constants table, so no sun-synchronous rate exists for it; ` +
          'give the body as an object with year (days), e.g. { "name": "' +
          body.name +
          '", "year": 365.25 }',
      );
    // The mean sun's rate seen from the body, 360° per the body's own (tropical) year: Vallado, "Fundamentals of Astrodynamics and Applications" (4th ed.), ch. 9, sun-synchronous orbits (recalled from memory).
    const sunRateDegPerDay = 360 / body.year;
    const rate = (sunRateDegPerDay * DEG) / SECONDS_PER_DAY;
    const i = inclinationForNodalRate(body.mu, body.j2ReferenceRadius, body.j2, c.a, c.e, rate);
    return result({ inclination: i * RAD, raanRate: sunRateDegPerDay, period: periodOf(body.mu, c.a) }, body, {
      messages,
      conics: [plotOf("orbit", c)],
    });
  },
};
