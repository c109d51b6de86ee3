import { describe, expect, it } from "vitest";
import { NOT_A_NUMBER, convertWritten, decimalWithAllowance, parseDecimal } from "./units";
import { unreadableWritten } from "./claims";

describe("values as people write them", () => {
  it("reads plain decimals with their written precision (contract version 2: half a unit in the last digit)", () => {
    expect(parseDecimal("3.9")).toMatchObject({ ok: true, value: 3.9, allowance: 0.05 });
    expect(parseDecimal("3.90")).toMatchObject({ ok: true, allowance: 0.005 });
    expect(parseDecimal("86400")).toMatchObject({ ok: true, allowance: 0.5 });
    expect(parseDecimal("8.64e4")).toMatchObject({ ok: true, value: 86400, allowance: 50 });
    expect(parseDecimal("86 400")).toMatchObject({ ok: true, value: 86400, text: "86400" });
  });

  it("says a comma or letters are not a number", () => {
    for (const bad of ["400,5", "abc", "3.9 km/s", "0x10", "--1"]) expect(parseDecimal(bad)).toEqual({ ok: false, message: NOT_A_NUMBER });
    expect(parseDecimal("1e400").ok).toBe(false);
  });

  it("converts to the contract unit and scales the allowance with the value", () => {
    const min = convertWritten({ text: "96.5", unit: "min" }, "s");
    expect(min).toMatchObject({ value: 5790, allowance: 3, factor: 60 });
    // 3 s cannot be written as a half-unit of a decimal digit: the next tighter one (0.5 s) is sent.
    expect(min).toMatchObject({ claimedText: "5790" });
    const m = convertWritten({ text: "400500", unit: "m" }, "km");
    expect(m).toMatchObject({ value: 400.5, claimedText: "400.500" });
    const rad = convertWritten({ text: "1.7", unit: "rad" }, "deg");
    expect("value" in rad && rad.value).toBeCloseTo(97.40282, 4);
    expect(convertWritten({ text: "5790", unit: "s" }, "s")).toMatchObject({ claimedText: "5790", factor: 1, allowance: 0.5 });
    expect(convertWritten({ text: "400,5", unit: "km" }, "km")).toEqual({ error: NOT_A_NUMBER });
  });

  it("writes a value to the precision of an allowance", () => {
    expect(decimalWithAllowance(5400, 180)).toBe("54e2");
    expect(decimalWithAllowance(1.23456, 0.0005)).toBe("1.235");
    expect(parseDecimal(decimalWithAllowance(5400, 180))).toMatchObject({ ok: true, value: 5400, allowance: 50 });
  });

  it("names a block's unreadable value for the submission check", () => {
    const block = {
      blockId: "b",
      label: "parking orbit",
      claim: { kind: "orbit", given: {} },
      written: { given: { periapsisAltitude: { text: "400,5", unit: "km" } } },
    };
    expect(unreadableWritten(block)).toBe('Periapsis altitude "400,5" is not a number; use a point for decimals');
  });
});

describe("the written attribute of stored blocks", () => {
  it("keeps text and unit per quantity and drops anything else", async () => {
    const { validateDossier } = await import("./sanitize");
    const block = (written: unknown) => ({
      type: "doc",
      content: [
        {
          type: "orbitCheck",
          attrs: { blockId: "0b7c3a52-0f7e-4c55-9d0a-1c2b3d4e5f60", label: "", claim: { kind: "orbit", given: { altitude: 500 } }, written },
        },
      ],
    });
    const kept = validateDossier(block({ given: { altitude: { text: "500000", unit: "m" } }, claimed: { period: { text: "94.8", unit: "min" } } }));
    expect(kept.ok && kept.doc.content[0]!.attrs!.written).toEqual({
      given: { altitude: { text: "500000", unit: "m" } },
      claimed: { period: { text: "94.8", unit: "min" } },
    });
    const junk = validateDossier(block({ given: { altitude: { text: 5, unit: "<script>" }, "bad key": { text: "1", unit: "s" } }, other: 1 }));
    expect(junk.ok && junk.doc.content[0]!.attrs!.written).toBeUndefined();
    // A block stored before units were offered (plain numbers, no `written`) still loads.
    const old = validateDossier(block(undefined));
    expect(old.ok && old.doc.content[0]!.attrs!.claim).toEqual({ kind: "orbit", given: { altitude: 500 } });
  });
});
