// The read-only contact pictures: drawn on the server from a stored contactTime claim, as SVG
// with text alternatives, and bounded by the engine's station-day budget per page.
import { createElement, Fragment } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { evaluateClaim } from "@/lib/orbit";
import { storedContactPictures } from "./stored-contact-pictures";

// Invented station (demo-style data, not a real site).
const station = { name: "Tallvik", latitude: 64.8, longitude: -147.7, altitude: 0.2, minimumElevation: 10 };
const claim = (days: number, stations = [station]) => ({
  id: "c",
  kind: "contactTime",
  body: "earth",
  given: { altitude: 550, inclination: 97.6, stations, days },
});
const html = (node: unknown) => renderToStaticMarkup(createElement(Fragment, null, node as never));

describe("stored contact pictures", () => {
  it("draws the timeline and ground-track map of a stored contact result with the recorded figures", () => {
    const stored = claim(7);
    const result = evaluateClaim(stored);
    const pictures = storedContactPictures([
      { blockId: "b1", label: "downlink contact", kind: "contactTime", claim: stored, result },
      { blockId: "b2", label: "parking orbit", kind: "orbit", claim: { kind: "orbit" }, result: {} },
    ]);
    expect(Object.keys(pictures)).toEqual(["b1"]);
    const out = html(pictures.b1);
    expect(out).toContain('role="img"');
    expect(out).toContain("<title");
    expect(out).toMatch(/Contact timeline of downlink contact/);
    expect(out).toMatch(/Ground track of downlink contact/);
    // The text alternative lists each day's contacts; the figures are the recorded ones.
    expect(out).toMatch(/Day 7: \d+ contacts?/);
    expect(out).toContain(`${(result.computed.passesPerDay as number).toFixed(2)} on average`);
    expect(out).toContain("Tallvik");
    expect(out).not.toContain("Data volume per day");
  });

  it("shows the daily data volume (contact time × data rate) when the claim gives a data rate", () => {
    const stored = { ...claim(7), given: { ...claim(7).given, dataRate: 50e6 } };
    const result = evaluateClaim(stored);
    const out = html(storedContactPictures([{ blockId: "v", label: "volume", kind: "contactTime", claim: stored, result }]).v);
    const perDay = ((result.computed.contactPerDay as number) * 50e6) / 1e9;
    expect(out).toContain(`Data volume per day</dt><dd>${perDay.toFixed(1)} Gbit on average`);
  });

  it("a page draws at most the engine's 300 station-days; later blocks get a note instead", () => {
    const big = claim(
      30,
      Array.from({ length: 10 }, (_, k) => ({ ...station, name: `Site ${k}` })),
    );
    const pictures = storedContactPictures([
      { blockId: "first", label: "all sites", kind: "contactTime", claim: big, result: {} },
      { blockId: "second", label: "one more", kind: "contactTime", claim: claim(1), result: {} },
    ]);
    expect(html(pictures.first)).toMatch(/Contact timeline of all sites/);
    expect(html(pictures.second)).toMatch(/No contact pictures for one more here: this page draws at most 300 station-days/);
  });

  it("a stored claim that cannot be evaluated says why instead of drawing", () => {
    const bad = { ...claim(7), given: { altitude: 550, inclination: 97.6, stations: [{ ...station, latitude: 95 }] } };
    const out = html(storedContactPictures([{ blockId: "x", label: "bad", kind: "contactTime", claim: bad, result: {} }]).x);
    expect(out).toMatch(/No contact picture: .*latitude must lie between/);
  });
});
