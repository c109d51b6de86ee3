/**
 * CCSDS Orbit Data Messages (CCSDS 502.0-B-2, "Orbit Data Messages"): the keywords, sections
 * and units of the OPM, OMM and OEM, shared by the KVN and XML readers. Both readers turn a
 * message into keyword entries with their line numbers; the builders here check them and
 * produce the parsed file.
 */
import { LIMITS, checkFrame, checkTimeSystem, clip, parseCcsdsEpoch, parseNumber, stop } from "./common";
import type {
  Covariance,
  FileHeader,
  KeplerianElements,
  Maneuver,
  OdmMetadata,
  OemCovariance,
  OemFile,
  OemSegment,
  OmmFile,
  OpmFile,
  SpacecraftParameters,
  StateVector,
  TleParameters,
} from "./types";

export interface Entry {
  key: string;
  value: string;
  unit: string | null;
  line: number;
}

type Kind = "text" | "number" | "epoch" | "int";
interface KeySpec {
  kind: Kind;
  /** Units the standard writes for this keyword (lower case); a bracketed unit must be one of them. */
  units?: string[];
}

const KM = ["km"];
const KMS = ["km/s"];
const DEG = ["deg"];
const t: KeySpec = { kind: "text" };
const ep: KeySpec = { kind: "epoch" };
const n = (units?: string[]): KeySpec => ({ kind: "number", units });
const int: KeySpec = { kind: "int" };

/** The 21 covariance keywords in lower-triangle order (CCSDS 502.0-B-2, OPM/OMM covariance section). */
export const COVARIANCE_KEYS = (() => {
  const axes = ["X", "Y", "Z", "X_DOT", "Y_DOT", "Z_DOT"];
  const keys: string[] = [];
  for (let i = 0; i < 6; i += 1) for (let j = 0; j <= i; j += 1) keys.push(`C${axes[i]}_${axes[j]}`);
  return keys;
})();
const covUnit = (key: string) => {
  const dots = (key.match(/_DOT/g) ?? []).length;
  return dots === 0 ? ["km**2"] : dots === 1 ? ["km**2/s"] : ["km**2/s**2"];
};

const HEADER: Record<string, KeySpec> = { CREATION_DATE: t, ORIGINATOR: t, MESSAGE_ID: t };
const META: Record<string, KeySpec> = { OBJECT_NAME: t, OBJECT_ID: t, CENTER_NAME: t, REF_FRAME: t, REF_FRAME_EPOCH: t, TIME_SYSTEM: t };
const STATE: Record<string, KeySpec> = { EPOCH: ep, X: n(KM), Y: n(KM), Z: n(KM), X_DOT: n(KMS), Y_DOT: n(KMS), Z_DOT: n(KMS) };
const KEPLER: Record<string, KeySpec> = {
  SEMI_MAJOR_AXIS: n(KM),
  ECCENTRICITY: n(),
  INCLINATION: n(DEG),
  RA_OF_ASC_NODE: n(DEG),
  ARG_OF_PERICENTER: n(DEG),
  TRUE_ANOMALY: n(DEG),
  MEAN_ANOMALY: n(DEG),
  GM: n(["km**3/s**2"]),
};
const SPACECRAFT: Record<string, KeySpec> = {
  MASS: n(["kg"]),
  SOLAR_RAD_AREA: n(["m**2"]),
  SOLAR_RAD_COEFF: n(),
  DRAG_AREA: n(["m**2"]),
  DRAG_COEFF: n(),
};
const COVARIANCE: Record<string, KeySpec> = {
  COV_REF_FRAME: t,
  ...Object.fromEntries(COVARIANCE_KEYS.map((k) => [k, n(covUnit(k))])),
};
const MANEUVER: Record<string, KeySpec> = {
  MAN_EPOCH_IGNITION: ep,
  MAN_DURATION: n(["s"]),
  MAN_DELTA_MASS: n(["kg"]),
  MAN_REF_FRAME: t,
  MAN_DV_1: n(KMS),
  MAN_DV_2: n(KMS),
  MAN_DV_3: n(KMS),
};
const OMM_META: Record<string, KeySpec> = { ...META, MEAN_ELEMENT_THEORY: t };
const MEAN: Record<string, KeySpec> = {
  EPOCH: ep,
  SEMI_MAJOR_AXIS: n(KM),
  MEAN_MOTION: n(["rev/day"]),
  ECCENTRICITY: n(),
  INCLINATION: n(DEG),
  RA_OF_ASC_NODE: n(DEG),
  ARG_OF_PERICENTER: n(DEG),
  MEAN_ANOMALY: n(DEG),
  GM: n(["km**3/s**2"]),
};
const TLE_PARAMS: Record<string, KeySpec> = {
  EPHEMERIS_TYPE: int,
  CLASSIFICATION_TYPE: t,
  NORAD_CAT_ID: int,
  ELEMENT_SET_NO: int,
  REV_AT_EPOCH: int,
  BSTAR: n(["1/er"]),
  BTERM: n(["m**2/kg"]),
  MEAN_MOTION_DOT: n(["rev/day**2"]),
  MEAN_MOTION_DDOT: n(["rev/day**3"]),
  AGOM: n(["m**2/kg"]),
};
const OEM_META: Record<string, KeySpec> = {
  ...META,
  START_TIME: ep,
  USEABLE_START_TIME: ep,
  USEABLE_STOP_TIME: ep,
  STOP_TIME: ep,
  INTERPOLATION: t,
  INTERPOLATION_DEGREE: int,
};

interface Section {
  name: string;
  keys: Record<string, KeySpec>;
  repeat?: boolean;
}

const OPM_SECTIONS: Section[] = [
  { name: "header", keys: HEADER },
  { name: "metadata", keys: META },
  { name: "state vector", keys: STATE },
  { name: "Keplerian elements", keys: KEPLER },
  { name: "spacecraft parameters", keys: SPACECRAFT },
  { name: "covariance", keys: COVARIANCE },
  { name: "maneuver parameters", keys: MANEUVER, repeat: true },
];
const OMM_SECTIONS: Section[] = [
  { name: "header", keys: HEADER },
  { name: "metadata", keys: OMM_META },
  { name: "mean elements", keys: MEAN },
  { name: "spacecraft parameters", keys: SPACECRAFT },
  { name: "TLE-related parameters", keys: TLE_PARAMS },
  { name: "covariance", keys: COVARIANCE },
];

/** One section's values, keyed, with the line where a missing keyword is reported. */
class Bag {
  readonly map = new Map<string, Entry>();
  constructor(
    readonly section: Section,
    readonly missingLine: number,
  ) {}
  has(key: string) {
    return this.map.has(key);
  }
  get size() {
    return this.map.size;
  }
  private entry(key: string, required: boolean): Entry | null {
    const e = this.map.get(key);
    if (!e) {
      if (required) stop(this.missingLine, `${key} missing in the ${this.section.name}`);
      return null;
    }
    return e;
  }
  text(key: string): string;
  text(key: string, required: false): string | null;
  text(key: string, required = true): string | null {
    const e = this.entry(key, required);
    if (!e) return null;
    if (e.value.trim() === "") stop(e.line, `${key} has no value`);
    return e.value.trim();
  }
  num(key: string): number;
  num(key: string, required: false): number | null;
  num(key: string, required = true): number | null {
    const e = this.entry(key, required);
    return e ? parseNumber(e.value, e.line, key) : null;
  }
  int(key: string): number | null {
    const e = this.entry(key, false);
    if (!e) return null;
    if (!/^\s*[+-]?\d{1,15}\s*$/.test(e.value)) stop(e.line, `${key} "${clip(e.value.trim())}" is not a whole number`);
    return Number(e.value);
  }
  epoch(key: string) {
    const e = this.entry(key, true)!;
    return parseCcsdsEpoch(e.value, e.line, key);
  }
  line(key: string): number {
    return this.map.get(key)?.line ?? this.missingLine;
  }
}

function checkEntry(e: Entry, spec: KeySpec, message: string): void {
  if (e.unit !== null && spec.units && !spec.units.includes(e.unit.trim().toLowerCase()))
    stop(e.line, `${e.key} is given in [${clip(e.unit)}]; a CCSDS ${message} gives it in [${spec.units[0]}]`);
  if (e.unit !== null && !spec.units && e.unit.trim() !== "" && spec.kind !== "text")
    stop(e.line, `${e.key} has no unit, but [${clip(e.unit)}] is written after it`);
}

export interface Sorted {
  bags: Bag[];
  /** Repeated sections (maneuvers): one bag per occurrence. */
  repeats: Bag[];
  comments: string[];
}

/**
 * Sorts a flat OPM/OMM entry list into its sections, in the order the standard gives them:
 * unknown keywords, duplicates and keywords out of order are refused at their line.
 */
function sortEntries(entries: Entry[], sections: Section[], message: string, endLine: number, startLine?: number): Sorted {
  const sectionOf = (key: string) => sections.findIndex((s) => key in s.keys);
  const groups: Entry[][] = sections.map(() => []);
  const repeats: Entry[][] = [];
  const comments: string[] = [];
  let current = 0;
  for (const e of entries) {
    if (e.key === "COMMENT") {
      comments.push(e.value);
      continue;
    }
    if (e.key.startsWith("USER_DEFINED_")) continue;
    const s = sectionOf(e.key);
    if (s < 0) stop(e.line, `${clip(e.key)} is not a keyword of a CCSDS ${message}`);
    if (s < current) stop(e.line, `${e.key} belongs in the ${sections[s]!.name}, which comes before the ${sections[current]!.name}`);
    current = s;
    checkEntry(e, sections[s]!.keys[e.key]!, message);
    if (sections[s]!.repeat) {
      const last = repeats[repeats.length - 1];
      if (!last || last.some((x) => x.key === e.key)) {
        if (repeats.length >= 100) stop(e.line, "more than 100 maneuvers; split the message");
        repeats.push([e]);
      } else last.push(e);
      continue;
    }
    const dup = groups[s]!.find((x) => x.key === e.key);
    if (dup) stop(e.line, `${e.key} appears twice (first on line ${dup.line})`);
    groups[s]!.push(e);
  }
  const firstLineAfter = (s: number) => {
    for (let k = s + 1; k < groups.length; k += 1) if (groups[k]!.length) return groups[k]![0]!.line;
    return endLine;
  };
  const bags = groups.map((g, s) => {
    const bag = new Bag(sections[s]!, startLine ?? (g.length ? g[0]!.line : firstLineAfter(s)));
    for (const e of g) bag.map.set(e.key, e);
    return bag;
  });
  const repeatSection = sections.find((s) => s.repeat);
  const repeatBags = repeats.map((g) => {
    const bag = new Bag(repeatSection!, g[g.length - 1]!.line + 1);
    for (const e of g) bag.map.set(e.key, e);
    return bag;
  });
  return { bags, repeats: repeatBags, comments };
}

export interface VersionLine {
  version: string;
  line: number;
}

function header(bag: Bag, version: VersionLine, comments: string[]): FileHeader {
  const created = bag.has("CREATION_DATE") ? bag.epoch("CREATION_DATE").text : null;
  return {
    version: version.version,
    creationDate: created,
    originator: bag.text("ORIGINATOR", false),
    messageId: bag.text("MESSAGE_ID", false),
    comments: comments.slice(0, 20),
  };
}

function checkVersion(version: VersionLine, message: string): void {
  if (!/^[123]\.\d+$/.test(version.version.trim()))
    stop(version.line, `CCSDS_${message}_VERS "${clip(version.version)}" is not a version this product reads (1.0, 2.0 or 3.0)`);
}

function metadata(bag: Bag, allowTeme: boolean): OdmMetadata {
  const frame = bag.text("REF_FRAME");
  const ts = bag.text("TIME_SYSTEM");
  return {
    objectName: bag.text("OBJECT_NAME"),
    objectId: bag.text("OBJECT_ID"),
    centerName: bag.text("CENTER_NAME").toUpperCase(),
    refFrame: checkFrame(frame, bag.line("REF_FRAME"), allowTeme),
    refFrameEpoch: bag.text("REF_FRAME_EPOCH", false),
    timeSystem: checkTimeSystem(ts, bag.line("TIME_SYSTEM")),
  };
}

function spacecraft(bag: Bag): SpacecraftParameters | null {
  if (bag.size === 0) return null;
  return {
    mass: bag.num("MASS", false),
    solarRadArea: bag.num("SOLAR_RAD_AREA", false),
    solarRadCoeff: bag.num("SOLAR_RAD_COEFF", false),
    dragArea: bag.num("DRAG_AREA", false),
    dragCoeff: bag.num("DRAG_COEFF", false),
  };
}

function covariance(bag: Bag): Covariance | null {
  if (bag.size === 0) return null;
  const refFrame = bag.text("COV_REF_FRAME", false);
  if (refFrame !== null) checkCovFrame(refFrame, bag.line("COV_REF_FRAME"));
  return { refFrame, epoch: null, lowerTriangle: COVARIANCE_KEYS.map((k) => bag.num(k)) };
}

/** Covariance frames: the inertial ones, or the local orbital frames the standard names (RTN/TNW). */
function checkCovFrame(frame: string, line: number): void {
  const f = frame.trim().toUpperCase();
  if (["RSW", "RTN", "TNW", "RIC"].includes(f)) return;
  checkFrame(f, line, false, "COV_REF_FRAME");
}

function angle(bag: Bag, key: string, lo: number, hi: number): number {
  const x = bag.num(key);
  if (!(x >= lo && x <= hi)) stop(bag.line(key), `${key} ${x}° is outside ${lo}–${hi}°`);
  return x;
}

function eccentricity(bag: Bag): number {
  const e = bag.num("ECCENTRICITY");
  if (!(e >= 0)) stop(bag.line("ECCENTRICITY"), `ECCENTRICITY ${e} is negative`);
  return e;
}

export function buildOpm(entries: Entry[], version: VersionLine, encoding: "kvn" | "xml", endLine: number): OpmFile {
  checkVersion(version, "OPM");
  const { bags, repeats, comments } = sortEntries(entries, OPM_SECTIONS, "OPM", endLine);
  const [hb, mb, sb, kb, pb, cb] = bags as [Bag, Bag, Bag, Bag, Bag, Bag];
  const meta = metadata(mb, false);
  const state: StateVector = {
    epoch: sb.epoch("EPOCH"),
    r: [sb.num("X"), sb.num("Y"), sb.num("Z")],
    v: [sb.num("X_DOT"), sb.num("Y_DOT"), sb.num("Z_DOT")],
  };
  let keplerian: KeplerianElements | null = null;
  if (kb.size > 0) {
    const ta = kb.num("TRUE_ANOMALY", false);
    const ma = kb.num("MEAN_ANOMALY", false);
    if (ta === null && ma === null) stop(kb.missingLine, "TRUE_ANOMALY or MEAN_ANOMALY missing in the Keplerian elements");
    if (ta !== null && ma !== null) stop(kb.line("MEAN_ANOMALY"), "give TRUE_ANOMALY or MEAN_ANOMALY, not both");
    keplerian = {
      semiMajorAxis: kb.num("SEMI_MAJOR_AXIS"),
      eccentricity: eccentricity(kb),
      inclination: angle(kb, "INCLINATION", 0, 180),
      raan: kb.num("RA_OF_ASC_NODE"),
      argPericenter: kb.num("ARG_OF_PERICENTER"),
      trueAnomaly: ta,
      meanAnomaly: ma,
      gm: kb.num("GM"),
    };
    if (!(keplerian.gm > 0)) stop(kb.line("GM"), `GM ${keplerian.gm} must be positive`);
  }
  const maneuvers: Maneuver[] = repeats.map((b) => {
    const frame = b.text("MAN_REF_FRAME").toUpperCase();
    if (!["RSW", "RTN", "TNW"].includes(frame)) checkFrame(frame, b.line("MAN_REF_FRAME"), false, "MAN_REF_FRAME");
    return {
      epochIgnition: b.epoch("MAN_EPOCH_IGNITION").text,
      duration: b.num("MAN_DURATION"),
      deltaMass: b.num("MAN_DELTA_MASS"),
      refFrame: frame,
      dv: [b.num("MAN_DV_1"), b.num("MAN_DV_2"), b.num("MAN_DV_3")],
    };
  });
  return {
    format: "opm",
    encoding,
    header: header(hb, version, comments),
    metadata: meta,
    state,
    keplerian,
    spacecraft: spacecraft(pb),
    covariance: covariance(cb),
    maneuvers,
  };
}

export function buildOmm(entries: Entry[], version: VersionLine, encoding: "kvn" | "xml", endLine: number): OmmFile {
  checkVersion(version, "OMM");
  const { bags, comments } = sortEntries(entries, OMM_SECTIONS, "OMM", endLine);
  const [hb, mb, eb, pb, tb, cb] = bags as [Bag, Bag, Bag, Bag, Bag, Bag];
  const theory = mb.text("MEAN_ELEMENT_THEORY");
  const meta = metadata(mb, true);
  const sgp4Theory = /^SGP4?(\/SGP4)?(-XP)?$|^SGP\/SGP4$/i.test(theory.trim());
  if (meta.refFrame === "TEME" && !sgp4Theory) stop(mb.line("REF_FRAME"), `REF_FRAME TEME goes with MEAN_ELEMENT_THEORY SGP/SGP4, not ${clip(theory)}`);
  const mm = eb.num("MEAN_MOTION", false);
  const sma = eb.num("SEMI_MAJOR_AXIS", false);
  if (mm === null && sma === null) stop(eb.missingLine, "MEAN_MOTION or SEMI_MAJOR_AXIS missing in the mean elements");
  if (mm !== null && sma !== null) stop(eb.line("SEMI_MAJOR_AXIS"), "give MEAN_MOTION or SEMI_MAJOR_AXIS, not both");
  if (mm !== null && !(mm > 0)) stop(eb.line("MEAN_MOTION"), `MEAN_MOTION ${mm} rev/day must be positive`);
  if (sma !== null && !(sma > 0)) stop(eb.line("SEMI_MAJOR_AXIS"), `SEMI_MAJOR_AXIS ${sma} km must be positive`);
  let tle: TleParameters | null = null;
  if (tb.size > 0) {
    tle = {
      ephemerisType: tb.int("EPHEMERIS_TYPE"),
      classificationType: tb.text("CLASSIFICATION_TYPE", false),
      noradCatId: tb.int("NORAD_CAT_ID"),
      elementSetNo: tb.int("ELEMENT_SET_NO"),
      revAtEpoch: tb.int("REV_AT_EPOCH"),
      bstar: tb.num("BSTAR", false),
      meanMotionDot: tb.num("MEAN_MOTION_DOT", false),
      meanMotionDdot: tb.num("MEAN_MOTION_DDOT", false),
    };
  }
  return {
    format: "omm",
    encoding,
    header: header(hb, version, comments),
    metadata: { ...meta, meanElementTheory: theory },
    meanElements: {
      epoch: eb.epoch("EPOCH"),
      meanMotion: mm,
      semiMajorAxis: sma,
      eccentricity: eccentricity(eb),
      inclination: angle(eb, "INCLINATION", 0, 180),
      raan: eb.num("RA_OF_ASC_NODE"),
      argPericenter: eb.num("ARG_OF_PERICENTER"),
      meanAnomaly: eb.num("MEAN_ANOMALY"),
      gm: eb.num("GM", false),
    },
    spacecraft: spacecraft(pb),
    tleParameters: tle,
    covariance: covariance(cb),
  };
}

/** One ephemeris line (KVN) or stateVector element (XML): epoch then 6 (or 9) numbers. */
export interface RawState {
  line: number;
  fields: string[];
}

/** One covariance matrix as read, before its numbers are checked. */
export interface RawCovariance {
  line: number;
  epoch: { text: string; line: number } | null;
  refFrame: { text: string; line: number } | null;
  /** The 21 values in COVARIANCE_KEYS order, each with its line (and unit, in XML). */
  values: { text: string; line: number; key: string; unit?: string | null }[];
}

export interface RawSegment {
  line: number;
  meta: Entry[];
  metaEndLine: number;
  states: RawState[];
  covarianceCount: number;
  covariances: RawCovariance[];
}

function parseOemCovariance(raw: RawCovariance): OemCovariance {
  if (!raw.epoch) stop(raw.line, "EPOCH missing in the covariance matrix");
  const epoch = parseCcsdsEpoch(raw.epoch.text, raw.epoch.line, "EPOCH");
  const refFrame = raw.refFrame ? raw.refFrame.text.trim().toUpperCase() : null;
  if (raw.refFrame) checkCovFrame(raw.refFrame.text, raw.refFrame.line);
  if (raw.values.length !== 21) stop(raw.line, `the covariance matrix has ${raw.values.length} of its 21 values`);
  const lowerTriangle = raw.values.map((v) => {
    if (v.unit !== undefined && v.unit !== null && !covUnit(v.key).includes(v.unit.toLowerCase()))
      stop(v.line, `${v.key} is given in [${clip(v.unit)}]; a CCSDS OEM gives it in [${covUnit(v.key)[0]}]`);
    return parseNumber(v.text, v.line, v.key);
  });
  // The diagonal holds variances (the 1st, 3rd, 6th, 10th, 15th and 21st values of the lower triangle).
  for (const d of [0, 2, 5, 9, 14, 20]) if (lowerTriangle[d]! < 0) stop(raw.values[d]!.line, `${raw.values[d]!.key} is negative; a variance cannot be`);
  return { epoch, refFrame, lowerTriangle };
}

function parseState(raw: RawState): StateVector {
  const f = raw.fields;
  if (f.length !== 7 && f.length !== 10)
    stop(raw.line, `an ephemeris line holds an epoch and 6 numbers (or 9 with accelerations); this one has ${f.length} items`);
  const x = f.slice(1).map((s, i) => parseNumber(s, raw.line, ["X", "Y", "Z", "X_DOT", "Y_DOT", "Z_DOT", "X_DDOT", "Y_DDOT", "Z_DDOT"][i]!));
  return { epoch: parseCcsdsEpoch(f[0]!, raw.line, "the epoch"), r: [x[0]!, x[1]!, x[2]!], v: [x[3]!, x[4]!, x[5]!] };
}

export function buildOem(segments: RawSegment[], headerEntries: Entry[], version: VersionLine, encoding: "kvn" | "xml", tick: () => void): OemFile {
  checkVersion(version, "OEM");
  if (segments.length === 0) stop(null, "the OEM has no segment (META_START … META_STOP followed by ephemeris lines)");
  if (segments.length > LIMITS.maxSegments) stop(segments[LIMITS.maxSegments]!.line, `more than ${LIMITS.maxSegments} segments; split the file`);
  const { bags, comments } = sortEntries(headerEntries, [{ name: "header", keys: HEADER }], "OEM", segments[0]!.line);
  const out: OemSegment[] = segments.map((seg) => {
    const { bags: mbags } = sortEntries(seg.meta, [{ name: "metadata", keys: OEM_META }], "OEM", seg.metaEndLine, seg.line);
    const mb = mbags[0]!;
    const meta = metadata(mb, false);
    const start = mb.epoch("START_TIME");
    const stopTime = mb.epoch("STOP_TIME");
    if (stopTime.ms < start.ms) stop(mb.line("STOP_TIME"), "STOP_TIME is before START_TIME");
    const useableStart = mb.has("USEABLE_START_TIME") ? mb.epoch("USEABLE_START_TIME").text : null;
    const useableStop = mb.has("USEABLE_STOP_TIME") ? mb.epoch("USEABLE_STOP_TIME").text : null;
    if (seg.states.length === 0) stop(seg.metaEndLine, "the segment has no ephemeris lines after its metadata (the file may be cut short)");
    // Every line is checked; only a bounded sample is kept.
    let prev = -Infinity;
    const keepEvery = Math.max(1, Math.ceil(seg.states.length / (LIMITS.oemSampleStates - 1)));
    const sample: StateVector[] = [];
    let first: StateVector | null = null;
    let last: StateVector | null = null;
    seg.states.forEach((raw, idx) => {
      tick();
      const s = parseState(raw);
      if (s.epoch.ms < prev) stop(raw.line, "this epoch is earlier than the line before; ephemeris lines go in time order");
      prev = s.epoch.ms;
      if (idx === 0) first = s;
      if (idx === seg.states.length - 1) last = s;
      if (idx % keepEvery === 0 || idx === seg.states.length - 1) sample.push(s);
    });
    const f = first as unknown as StateVector;
    const l = last as unknown as StateVector;
    // Covariance matrices: every one is checked, the first, the last and a bounded sample kept.
    let covariance: OemSegment["covariance"] = null;
    if (seg.covariances.length > 0) {
      const every = Math.max(1, Math.ceil(seg.covariances.length / (LIMITS.oemSampleCovariances - 1)));
      const kept: OemCovariance[] = [];
      let lastCov: OemCovariance | null = null;
      seg.covariances.forEach((raw, idx) => {
        tick();
        const c = parseOemCovariance(raw);
        if (idx === seg.covariances.length - 1) lastCov = c;
        if (idx % every === 0 || idx === seg.covariances.length - 1) kept.push(c);
      });
      const lc = lastCov as unknown as OemCovariance;
      covariance = {
        first: kept[0]!,
        last: lc,
        sample: kept.length > LIMITS.oemSampleCovariances ? [...kept.slice(0, LIMITS.oemSampleCovariances - 1), lc] : kept,
      };
    }
    if (f.epoch.ms < start.ms - 1 || l.epoch.ms > stopTime.ms + 1)
      stop(seg.states[f.epoch.ms < start.ms - 1 ? 0 : seg.states.length - 1]!.line, "this ephemeris line lies outside START_TIME … STOP_TIME of its segment");
    return {
      metadata: {
        ...meta,
        startTime: start.text,
        stopTime: stopTime.text,
        useableStartTime: useableStart,
        useableStopTime: useableStop,
        interpolation: mb.text("INTERPOLATION", false),
        interpolationDegree: mb.int("INTERPOLATION_DEGREE"),
      },
      stateCount: seg.states.length,
      first: f,
      last: l,
      sample: sample.length > LIMITS.oemSampleStates ? [...sample.slice(0, LIMITS.oemSampleStates - 1), l] : sample,
      covarianceCount: seg.covarianceCount,
      covariance,
    };
  });
  return { format: "oem", encoding, header: header(bags[0]!, version, comments), segments: out };
}
