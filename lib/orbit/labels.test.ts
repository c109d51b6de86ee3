import { describe, expect, it } from "vitest";
import { hintSentence, kindLabel, plainQuantities, policySummary, quantityLabel } from "./labels";

describe("plain labels for code names", () => {
  it("labels quantities with symbol and unit, and kinds in words", () => {
    expect(quantityLabel("periapsisAltitude")).toBe("Periapsis altitude h_p (km)");
    expect(quantityLabel("deltaVTotal")).toBe("Total Δv (km/s)");
    expect(quantityLabel("period", "min")).toBe("Orbital period T (min)");
    expect(quantityLabel("eccentricity")).toBe("Eccentricity e");
    expect(kindLabel("interplanetaryHohmann")).toBe("Hohmann transfer between planets");
    expect(quantityLabel("someFutureQuantity", "")).toBe("Some future quantity");
  });

  it("turns hints into sentences and never fails on unknown codes", () => {
    expect(hintSentence({ code: "unit-scale", message: "x", factor: 60 }, "period")).toBe(
      "Orbital period: It looks like minutes were written where seconds were meant.",
    );
    expect(hintSentence({ code: "unit-scale", factor: 0.001 }, undefined, "km/s")).toBe("It looks like m/s were written where km/s were meant.");
    expect(hintSentence({ code: "other-quantity", quantity: "apoapsisAltitude" })).toContain("recomputed apoapsis altitude");
    expect(hintSentence({ code: "no-such-code", message: "engine says so" })).toBe("Engine says so.");
    expect(hintSentence({ code: "no-such-code" })).toBeNull();
    expect(hintSentence("garbage")).toBeNull();
  });

  it("states a tolerance policy", () => {
    expect(policySummary({ relative: 0.001, absolute: { deg: 0.05 } })).toBe("checked at 0.1 %, angles 0.05°");
    expect(policySummary({ relative: 0.0005 })).toBe("checked at 0.05 %, angles 0.05°");
  });
});

describe("engine sentences in plain words", () => {
  it("replaces code names it knows and leaves other words", () => {
    expect(plainQuantities("two of periapsisAltitude, apoapsisAltitude or period; optional trueAnomaly")).toBe(
      "two of periapsis altitude, apoapsis altitude or period; optional true anomaly",
    );
    expect(plainQuantities("see iPhone")).toBe("see iPhone");
  });
});
