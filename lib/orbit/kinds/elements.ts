/** `elements`: position and velocity from classical elements. */
import { classify } from "../conics";
import { fail, fmt } from "../errors";
import { elementsToState } from "../state-vectors";
import { DEG, RAD, norm } from "../vector";
import type { KindDef } from "./types";
import { plotOf, stateWarnings, angleBetweenZeroAnd, result } from "./orbit-shape";

export const elementsKind: KindDef = {
  summary: "position and velocity from classical elements",
  givenRule: "semiMajorAxis or semiLatusRectum, eccentricity, inclination, raan, argPeriapsis, trueAnomaly (deg)",
  given: [
    ["semiMajorAxis", "choice"],
    ["semiLatusRectum", "choice"],
    ["eccentricity", "required"],
    ["inclination", "required"],
    ["raan", "required"],
    ["argPeriapsis", "required"],
    ["trueAnomaly", "required"],
  ],
  computed: ["position", "velocity", "radius", "speed"],
  evaluate(g, body) {
    const e = g.num("eccentricity", "nonNegative");
    if (g.has("semiMajorAxis") === g.has("semiLatusRectum")) fail("give semiMajorAxis or semiLatusRectum (exactly one)");
    let p: number;
    if (g.has("semiLatusRectum")) p = g.num("semiLatusRectum", "positive");
    else {
      const a = g.num("semiMajorAxis");
      if (classify(e) === "parabolic") fail("a parabola (e = 1) has no finite semi-major axis; give semiLatusRectum");
      if ((a > 0 && e > 1) || (a < 0 && e < 1) || a === 0)
        fail(`semiMajorAxis ${fmt(a)} km and eccentricity ${fmt(e)} disagree in sign convention (a > 0 for e < 1, a < 0 for e > 1)`);
      // p = a(1 − e²): Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, elliptical orbits (recalled from memory).
      p = a * (1 - e * e);
    }
    const i = angleBetweenZeroAnd(g, "inclination", 180);
    const raan = g.num("raan") * DEG;
    const w = g.num("argPeriapsis") * DEG;
    const nu = g.num("trueAnomaly") * DEG;
    const s = elementsToState(p, e, i, raan, w, nu, body.mu);
    // a = p / (1 − e²), none for the parabola: Curtis, "Orbital Mechanics for Engineering Students" (3rd ed.), ch. 2, the orbit formulas (recalled from memory).
    const conic = { p, e, a: classify(e) === "parabolic" ? Infinity : p / (1 - e * e) };
    const messages = stateWarnings(s.position, conic, body, "the position");
    return result({ position: [...s.position], velocity: [...s.velocity], radius: norm(s.position), speed: norm(s.velocity) }, body, {
      messages,
      conics: [plotOf("orbit", conic, { marker: nu * RAD })],
    });
  },
};
