/**
 * fast-check fuzzing of every orbit-file parser: 10,000 generated inputs each (mutations of
 * the fixtures and arbitrary text); none may throw, and every refusal carries a message and
 * a line inside the file (or none).
 */
import fs from "node:fs";
import path from "node:path";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parseOemKvn, parseOemXml, parseOmmKvn, parseOmmXml, parseOpmKvn, parseOpmXml, parseOrbitFile, parseTle, type ParseOutcome } from "./index";

const fixture = (name: string) => fs.readFileSync(path.join(__dirname, "fixtures", name), "utf8");

const opmKvn = fixture("ccsds-opm-example-2.kvn").replace("REF_FRAME = TOD", "REF_FRAME = EME2000");
/** The example OEM with a covariance block after its first segment (two matrices; the OPM example's covariance numbers). */
const covarianceRows = [
  "3.3313494e-04",
  "4.6189273e-04 6.7824216e-04",
  "-3.0700078e-04 -4.2212341e-04 3.2319319e-04",
  "-3.3493650e-07 -4.6860842e-07 2.4849495e-07 4.2960228e-10",
  "-2.2118325e-07 -2.8641868e-07 1.7980986e-07 2.6088992e-10 1.7675147e-10",
  "-3.0413460e-07 -4.9894969e-07 3.5403109e-07 1.8692631e-10 1.0088625e-10 6.2244443e-10",
];
const oemWithCovariance = (() => {
  const kvn = fixture("ccsds-oem-example.kvn");
  const at = kvn.lastIndexOf("\nMETA_START");
  const block = [
    "COVARIANCE_START",
    "EPOCH = 1996-12-18T12:00:00.331",
    "COV_REF_FRAME = EME2000",
    ...covarianceRows,
    "EPOCH = 1996-12-18T12:01:00.331",
    ...covarianceRows,
    "COVARIANCE_STOP",
  ];
  return `${kvn.slice(0, at)}\n${block.join("\n")}${kvn.slice(at)}`;
})();
const oemXmlWithCovariance = (() => {
  const xml = fixture("ccsds-oem-example.xml");
  const keys = ["X", "Y", "Z", "X_DOT", "Y_DOT", "Z_DOT"].flatMap((a, i) =>
    ["X", "Y", "Z", "X_DOT", "Y_DOT", "Z_DOT"].slice(0, i + 1).map((b) => `C${a}_${b}`),
  );
  const values = covarianceRows.join(" ").split(" ");
  const block = `<covarianceMatrix><EPOCH>1996-12-18T12:00:00.331</EPOCH>\n${keys.map((k, i) => `<${k}>${values[i]}</${k}>`).join("\n")}\n</covarianceMatrix>\n`;
  const at = xml.indexOf("</data>");
  return xml.slice(0, at) + block + xml.slice(at);
})();

const cases: [string, (t: string) => ParseOutcome, string][] = [
  ["element sets", parseTle, `${fixture("sgp4-verification-00005.tle")}VV-TEST\n${fixture("sgp4-verification-00005.tle")}`],
  ["OPM (KVN)", parseOpmKvn, opmKvn],
  ["OMM (KVN)", parseOmmKvn, fixture("ccsds-omm-example.kvn")],
  ["OEM (KVN)", parseOemKvn, fixture("ccsds-oem-example.kvn")],
  ["OEM with covariance (KVN)", parseOemKvn, oemWithCovariance],
  ["OEM with covariance (XML)", parseOemXml, oemXmlWithCovariance],
  ["OPM (XML)", parseOpmXml, fixture("ccsds-opm-example.xml")],
  ["OMM (XML)", parseOmmXml, fixture("ccsds-omm-example.xml")],
  ["OEM (XML)", parseOemXml, fixture("ccsds-oem-example.xml")],
  ["any file", parseOrbitFile, opmKvn],
];

/** Mutations that keep most of a valid file: the inputs that reach deep into a parser. */
function mutated(base: string) {
  const lines = base.split("\n");
  const edit = fc.oneof(
    fc.record({ kind: fc.constant("char" as const), at: fc.nat(base.length), ch: fc.string({ unit: "binary", minLength: 1, maxLength: 3 }) }),
    fc.record({ kind: fc.constant("dropLine" as const), at: fc.nat(lines.length) }),
    fc.record({ kind: fc.constant("dupLine" as const), at: fc.nat(lines.length) }),
    fc.record({ kind: fc.constant("truncate" as const), at: fc.nat(base.length) }),
    fc.record({ kind: fc.constant("insert" as const), at: fc.nat(lines.length), text: fc.string({ maxLength: 80 }) }),
    fc.record({ kind: fc.constant("digit" as const), at: fc.nat(base.length), ch: fc.constantFrom("0", "9", "-", ".", "e", " ", "+", "<", ">", "&", "=") }),
  );
  return fc.array(edit, { minLength: 1, maxLength: 4 }).map((edits) => {
    let ls = [...lines];
    let text = base;
    for (const e of edits) {
      text = ls.join("\n");
      if (e.kind === "char" || e.kind === "digit") text = text.slice(0, e.at) + e.ch + text.slice(e.at + 1);
      else if (e.kind === "truncate") text = text.slice(0, e.at);
      else if (e.kind === "dropLine") text = ls.filter((_, i) => i !== e.at).join("\n");
      else if (e.kind === "dupLine") text = [...ls.slice(0, e.at + 1), ...ls.slice(e.at)].join("\n");
      else text = [...ls.slice(0, e.at), e.text, ...ls.slice(e.at)].join("\n");
      ls = text.split("\n");
    }
    return text;
  });
}

it("the covariance bases parse (so the fuzzing starts from valid files)", () => {
  for (const [parse, text] of [
    [parseOemKvn, oemWithCovariance],
    [parseOemXml, oemXmlWithCovariance],
  ] as const) {
    const r = parse(text);
    expect(r.ok && r.file.format === "oem" && r.file.segments[0]!.covarianceCount).toBeGreaterThan(0);
  }
});

describe("fuzzing the orbit-file parsers (fast-check, 10,000 inputs each)", { timeout: 180_000 }, () => {
  for (const [name, parse, base] of cases) {
    it(`${name}: never throws, refusals name a line inside the file`, () => {
      const input = fc.oneof(
        { weight: 4, arbitrary: mutated(base) },
        { weight: 1, arbitrary: fc.string({ unit: "grapheme-ascii", maxLength: 400 }) },
        { weight: 1, arbitrary: fc.string({ unit: "binary", maxLength: 200 }) },
      );
      fc.assert(
        fc.property(input, (text) => {
          const r = parse(text);
          expect(typeof r.ok).toBe("boolean");
          if (!r.ok) {
            expect(r.error.message.length).toBeGreaterThan(3);
            expect(r.error.message.length).toBeLessThan(400);
            if (r.error.line !== null) {
              expect(Number.isInteger(r.error.line)).toBe(true);
              expect(r.error.line).toBeGreaterThan(0);
              expect(r.error.line).toBeLessThanOrEqual(text.split("\n").length + 1);
              expect(r.error.message.startsWith(`line ${r.error.line}: `)).toBe(true);
            }
          }
        }),
        { numRuns: 10_000, seed: 20261202 },
      );
    });
  }
});
