import { describe, expect, it } from "vitest";
import { parseAngleText, parseHeightText, stationFormInput, stationInput } from "./stations";

describe("station values as people write them", () => {
  it("reads angles with a degree sign, a hemisphere letter or a minus sign", () => {
    expect(parseAngleText("64.8", "S")).toBe(64.8);
    expect(parseAngleText("64.8° N", "S")).toBe(64.8);
    expect(parseAngleText("53 S", "S")).toBe(-53);
    expect(parseAngleText("147.7° W", "W")).toBe(-147.7);
    expect(parseAngleText("−147,7", "W")).toBe(-147.7);
    expect(parseAngleText("12 N", "W")).toBeNaN(); // a latitude letter on a longitude
    expect(parseAngleText("north", "S")).toBeNaN();
  });

  it("reads heights in m or km (bare numbers are metres)", () => {
    expect(parseHeightText("210")).toBeCloseTo(0.21, 12);
    expect(parseHeightText("210 m")).toBeCloseTo(0.21, 12);
    expect(parseHeightText("0.21 km")).toBeCloseTo(0.21, 12);
    expect(parseHeightText("")).toBe(0);
    expect(parseHeightText("tall")).toBeNaN();
  });

  it("turns the form into a station, and says what to fix", () => {
    const ok = stationFormInput.safeParse({ name: " North site ", latitude: "64.8° N", longitude: "147.7 W", altitude: "210 m", minimumElevation: "10" });
    expect(ok.success && ok.data).toEqual({ name: "North site", latitude: 64.8, longitude: -147.7, altitude: 0.21, minimumElevation: 10 });
    const bad = stationFormInput.safeParse({ name: "", latitude: "95", longitude: "east", altitude: "20 km", minimumElevation: "90" });
    expect(bad.success).toBe(false);
    const messages = Object.fromEntries(bad.error!.issues.map((i) => [i.path.join("."), i.message]));
    expect(messages.name).toMatch(/name/);
    expect(messages.latitude).toMatch(/between −90° \(south\) and 90° \(north\)/);
    expect(messages.longitude).toMatch(/number of degrees/);
    expect(messages.altitude).toMatch(/between −500 m and 10 km/);
    expect(messages.minimumElevation).toMatch(/below 90°/);
  });

  it("the API input refuses out-of-range numbers and defaults the altitude", () => {
    expect(stationInput.safeParse({ name: "A", latitude: -91, longitude: 0, minimumElevation: 5 }).success).toBe(false);
    expect(stationInput.parse({ name: "A", latitude: -45, longitude: 0, minimumElevation: 5 }).altitude).toBe(0);
  });
});
