/** `sphereOfInfluence`: Laplace sphere of influence of a body about its parent. */
import { fail } from "../errors";
import { sphereOfInfluence } from "../interplanetary";
import type { KindDef } from "./types";
import { result } from "./orbit-shape";

export const sphereOfInfluenceKind: KindDef = {
  summary: "Laplace sphere of influence of a body about its parent",
  givenRule: "nothing beyond body (a planet around the sun, or the moon around the earth; overrides may set orbitRadius and parentMu)",
  given: [],
  computed: ["radius"],
  evaluate(g, body) {
    if (body.orbitRadius === undefined || body.parentMu === undefined)
      fail(`${body.name} has no parent in the constants table; give a body with orbitRadius (km) and parentMu (km³/s²)`);
    return result({ radius: sphereOfInfluence(body.orbitRadius, body.mu, body.parentMu) }, body);
  },
};
