/** `interplanetaryHohmann`: patched-conic Hohmann transfer between two planets on circular coplanar orbits. */
import { resolveBody } from "../bodies";
import { fail, fmt } from "../errors";
import { interplanetaryHohmann, type PlanetLeg } from "../interplanetary";
import type { ComputedValue } from "../schema";
import type { KindDef } from "./types";
import { plotOf, circle, apseEllipse, result } from "./orbit-shape";

export const interplanetaryHohmannKind: KindDef = {
  summary: "patched-conic Hohmann transfer between two planets on circular coplanar orbits",
  givenRule:
    "from and to (planet names or override objects with mu, radius, orbitRadius), departureAltitude (km), optional arrivalAltitude (km); body is the central body (sun by default)",
  given: [
    ["from", "required"],
    ["to", "required"],
    ["departureAltitude", "required"],
    ["arrivalAltitude", "optional"],
  ],
  computed: ["transferTime", "departureExcessSpeed", "departureDeltaV", "arrivalExcessSpeed", "arrivalDeltaV", "synodicPeriod"],
  defaultBody: "sun",
  evaluate(g, central) {
    if (!g.has("from") || !g.has("to")) fail("interplanetaryHohmann needs given.from and given.to (planet names or override objects)");
    const leg = (label: "from" | "to"): PlanetLeg => {
      const b = resolveBody(g.value(label), "earth", `given.${label}`);
      if (b.orbitRadius === undefined) fail(`given.${label} (${b.name}) has no orbit radius about the central body; add orbitRadius (km)`);
      return { name: b.name, mu: b.mu, radius: b.radius, orbitRadius: b.orbitRadius };
    };
    const from = leg("from");
    const to = leg("to");
    const depAlt = g.num("departureAltitude");
    if (!(depAlt > 0)) fail(`departureAltitude must be above the surface of ${from.name} (got ${fmt(depAlt)} km)`);
    const arrAlt = g.optNum("arrivalAltitude");
    if (arrAlt !== undefined && !(arrAlt > 0)) fail(`arrivalAltitude must be above the surface of ${to.name} (got ${fmt(arrAlt)} km)`);
    const r = interplanetaryHohmann(central.mu, from, to, depAlt, arrAlt);
    const { arrivalDeltaV } = r;
    const values: Record<string, ComputedValue> = {
      transferTime: r.transferTime,
      departureExcessSpeed: r.departureExcessSpeed,
      departureDeltaV: r.departureDeltaV,
      arrivalExcessSpeed: r.arrivalExcessSpeed,
      synodicPeriod: r.synodicPeriod,
    };
    const unavailable: Record<string, string> = {};
    if (arrivalDeltaV !== undefined) values.arrivalDeltaV = arrivalDeltaV;
    else unavailable.arrivalDeltaV = "arrivalDeltaV needs given.arrivalAltitude (km) of the circular capture orbit";
    const r1 = from.orbitRadius;
    const r2 = to.orbitRadius;
    return result(values, central, {
      unavailable,
      conics: [
        plotOf(from.name, circle(r1)),
        plotOf("transfer", apseEllipse(r1, r2), { trueAnomalyRange: r2 > r1 ? [0, 180] : [180, 360] }),
        plotOf(to.name, circle(r2)),
      ],
    });
  },
};
