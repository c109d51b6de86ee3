import { describe, expect, it } from "vitest";
import { hintSentence, kindLabel, plainQuantities, policySummary, quantityLabel } from "./labels";
import { ORBIT_CHECK_KINDS } from "./index";

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

describe("ground coverage and link labels", () => {
  it("names every contactTime, linkBudget and repeatGroundTrack quantity in words, never by its code name", () => {
    for (const kind of ["contactTime", "linkBudget", "repeatGroundTrack"]) {
      const info = ORBIT_CHECK_KINDS.find((k) => k.kind === kind)!;
      for (const q of [...info.given, ...info.computed]) {
        const label = quantityLabel(q.name, q.unit, kind);
        // A fallback label splits the code name into lower-case words ("G over t", "Eb n0").
        expect(label, `${kind}.${q.name}`).not.toMatch(/^(G over t|Eirp|C over n0|Eb n0|Required eb n0|.* min \(|.* max \()/);
      }
    }
    expect(quantityLabel("gOverT", "dB/K", "linkBudget")).toBe("Receive figure of merit G/T (dB/K)");
    expect(quantityLabel("requiredEbN0", "dB", "linkBudget")).toBe("Required Eb/N0 (dB)");
  });

  it("linkBudget's margin reads as a link margin; the Δv budget's stays a Δv margin", () => {
    expect(quantityLabel("margin", "dB", "linkBudget")).toBe("Link margin (dB)");
    expect(quantityLabel("margin", "", "deltaVBudget")).toBe("Δv margin");
    expect(quantityLabel("margin", "")).toBe("Δv margin");
  });
});
