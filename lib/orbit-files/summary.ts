/**
 * What a parsed orbit file says about the orbit: epoch, frame, osculating elements derived
 * from its state (lib/orbit's state-vector conversion), altitude range, period, inclination
 * and the sun-synchronous check. Element sets (and SGP4 OMMs) go through satellite.js's SGP4
 * at their epoch for the osculating state, with the mean elements beside them.
 * Two-body screening estimates, not flight-qualified analysis.
 */
import { json2satrec, sgp4, twoline2satrec, type SatRec } from "satellite.js";
import { solveKeplerElliptic, trueFromEccentric } from "@/lib/orbit/anomalies/kepler";
import { BODIES, MEAN_SUN_RATE_DEG_PER_DAY, type BodyName } from "@/lib/orbit/constants";
import { inclinationForNodalRate, j2SecularRates } from "@/lib/orbit/j2";
import { elementsToState, stateToElements } from "@/lib/orbit/state-vectors";
import { convertState, inertialFrame, rotatePlane, temeToJ2000Matrix, transpose } from "@/lib/orbit/frames";
import { julianCenturiesTT, toUtc, type TimeScale } from "@/lib/orbit/time-scales";
import type { Epoch, OrbitFile, StateVector } from "./types";
import { isoOf } from "./common";

const DEG = Math.PI / 180;
const RAD = 180 / Math.PI;
const DAY_S = 86_400;

/** Nodal-rate band around the mean sun's 0.9856°/day within which an orbit counts as sun-synchronous (common practice: ±0.01°/day, about 3.7° of drift a year). */
export const SUN_SYNC_TOLERANCE_DEG_PER_DAY = 0.01;

export interface ElementsView {
  semiMajorAxisKm: number;
  eccentricity: number;
  inclinationDeg: number;
  raanDeg: number;
  argPeriapsisDeg: number;
  /** true anomaly (osculating) or mean anomaly (mean elements) */
  anomalyDeg: number;
  periapsisAltitudeKm: number;
  apoapsisAltitudeKm: number;
  periodMin: number;
}

export interface OrbitSummary {
  /** Which object of the file: element set, OEM segment (0-based); 0 otherwise. */
  index: number;
  label: string;
  epoch: string;
  timeSystem: string;
  frame: string;
  center: string;
  /** What the file gives: a state vector, mean elements (SGP4) or mean elements of another theory. */
  basis: "state vector" | "SGP4 mean elements" | "mean elements";
  /** Osculating two-body elements at the epoch, from the (SGP4) state. Null when the centre is not in the constants table. */
  osculating: ElementsView | null;
  /** The file's mean elements (element sets and OMMs), two-body derived quantities from them. */
  mean: ElementsView | null;
  /** Osculating minus mean, for element sets. */
  meanVsOsculating: { semiMajorAxisKm: number; eccentricity: number; inclinationDeg: number; periapsisAltitudeKm: number } | null;
  /** The values to compare with the text: mean elements when the file has them, else osculating. */
  compare: {
    altitudeKm: number;
    periapsisAltitudeKm: number;
    apoapsisAltitudeKm: number;
    inclinationDeg: number;
    eccentricity: number;
    periodMin: number;
    basis: "mean" | "osculating";
  } | null;
  sunSynchronous: { nodalRateDegPerDay: number; meanSunRateDegPerDay: number; sunSynchronous: boolean; inclinationForSunSyncDeg: number | null } | null;
  /** The state at epoch (km, km/s) the osculating elements come from. */
  state: { r: [number, number, number]; v: [number, number, number] } | null;
  /** The epoch in UTC (TAI and TT through the leap-second table); null when it cannot be converted. */
  epochUtc?: string | null;
  /**
   * The orbit plane in both frames: against Earth's equator at the epoch (TEME, the frame the
   * text's inclination is read in) and in EME2000 (J2000). Element sets are TEME; CCSDS states
   * in EME2000/J2000/GCRF are rotated (IAU-76/FK5, lib/orbit/frames.ts).
   */
  planes?: {
    ofDate: { inclinationDeg: number; raanDeg: number };
    eme2000: { inclinationDeg: number; raanDeg: number };
    /** The state at epoch in EME2000 (km, km/s), when the file has a state. */
    stateEme2000: { r: [number, number, number]; v: [number, number, number] } | null;
  } | null;
  /**
   * The file's covariance for this orbit, as 1σ per axis (the square roots of the diagonal):
   * OPM/OMM their one matrix, OEM segments their first and last (with the count).
   */
  covariance?: {
    count: number;
    first: CovarianceSigmas;
    last: CovarianceSigmas;
  } | null;
  notes: string[];
}

export interface CovarianceSigmas {
  epoch: string | null;
  /** null: the orbit's own frame. */
  refFrame: string | null;
  /** 1σ of x, y, z (km). */
  positionKm: [number, number, number];
  /** 1σ of ẋ, ẏ, ż (km/s). */
  velocityKmS: [number, number, number];
}

/** σ = √(diagonal) of a 6×6 lower triangle given row by row (indices 0, 2, 5, 9, 14, 20). */
export function sigmasOf(lowerTriangle: number[], epoch: string | null, refFrame: string | null): CovarianceSigmas {
  const d = [0, 2, 5, 9, 14, 20].map((k) => Math.sqrt(Math.max(0, lowerTriangle[k] ?? NaN)));
  return { epoch, refFrame, positionKm: [d[0]!, d[1]!, d[2]!], velocityKmS: [d[3]!, d[4]!, d[5]!] };
}

function withCovariance(summary: OrbitSummary, cov: OrbitSummary["covariance"]): OrbitSummary {
  return { ...summary, covariance: cov ?? null };
}

const CENTERS: Record<string, BodyName> = {
  EARTH: "earth",
  MOON: "moon",
  SUN: "sun",
  MERCURY: "mercury",
  VENUS: "venus",
  MARS: "mars",
  "MARS BARYCENTER": "mars",
  JUPITER: "jupiter",
  SATURN: "saturn",
  URANUS: "uranus",
  NEPTUNE: "neptune",
};

function view(a: number, e: number, i: number, raan: number, argp: number, anomaly: number, mu: number, radius: number): ElementsView {
  // Periapsis and apoapsis radii r = a(1 ∓ e); period T = 2π√(a³/μ) (Kepler's third law).
  const closed = a > 0 && e < 1;
  return {
    semiMajorAxisKm: a,
    eccentricity: e,
    inclinationDeg: i * RAD,
    raanDeg: raan * RAD,
    argPeriapsisDeg: argp * RAD,
    anomalyDeg: anomaly * RAD,
    periapsisAltitudeKm: a * (1 - e) - radius,
    apoapsisAltitudeKm: closed ? a * (1 + e) - radius : Infinity,
    periodMin: closed ? (2 * Math.PI * Math.sqrt((a * a * a) / mu)) / 60 : Infinity,
  };
}

function osculatingFrom(r: [number, number, number], v: [number, number, number], mu: number, radius: number): ElementsView {
  const el = stateToElements(r, v, mu);
  return view(el.a, el.e, el.i, el.raan, el.argPeriapsis, el.trueAnomaly, mu, radius);
}

function sunSync(body: BodyName, a: number, e: number, iDeg: number): OrbitSummary["sunSynchronous"] {
  if (body !== "earth" || !(a > 0) || !(e < 1)) return null;
  const b = BODIES.earth;
  const rates = j2SecularRates(b.mu.value, b.radius.value, b.j2.value, a, e, iDeg * DEG);
  const rate = rates.raanRate * RAD * DAY_S;
  let needed: number | null = null;
  try {
    needed = inclinationForNodalRate(b.mu.value, b.radius.value, b.j2.value, a, e, (MEAN_SUN_RATE_DEG_PER_DAY * DEG) / DAY_S) * RAD;
  } catch {
    needed = null;
  }
  return {
    nodalRateDegPerDay: rate,
    meanSunRateDegPerDay: MEAN_SUN_RATE_DEG_PER_DAY,
    sunSynchronous: Math.abs(rate - MEAN_SUN_RATE_DEG_PER_DAY) <= SUN_SYNC_TOLERANCE_DEG_PER_DAY,
    inclinationForSunSyncDeg: needed,
  };
}

/** SGP4 at epoch: TEME state (km, km/s) and the Brouwer mean semi-major axis (km). */
function sgp4AtEpoch(satrec: SatRec): { r: [number, number, number]; v: [number, number, number]; meanA: number } | null {
  const pv = sgp4(satrec, 0);
  if (!pv || satrec.error !== 0) return null;
  const p = pv.position as { x: number; y: number; z: number };
  const v = pv.velocity as { x: number; y: number; z: number };
  // Mean semi-major axis from the SGP4 (Brouwer) mean motion: a = (μ/n²)^(1/3), n in rad/s.
  const nRadS = satrec.no / 60;
  const meanA = Math.cbrt(398_600.8 / (nRadS * nRadS));
  return { r: [p.x, p.y, p.z], v: [v.x, v.y, v.z], meanA };
}

function fromSgp4(
  index: number,
  label: string,
  epoch: string,
  satrec: SatRec,
  mean: { e: number; i: number; raan: number; argp: number; m: number },
  frame: string,
  notes: string[],
): OrbitSummary {
  const earth = BODIES.earth;
  const base = { index, label, epoch, timeSystem: "UTC", frame, center: "EARTH", basis: "SGP4 mean elements" as const };
  const out = sgp4AtEpoch(satrec);
  if (!out)
    return {
      ...base,
      osculating: null,
      mean: null,
      meanVsOsculating: null,
      compare: null,
      sunSynchronous: null,
      state: null,
      notes: [...notes, "SGP4 could not propagate these elements to their epoch."],
    };
  const mu = earth.mu.value;
  const R = earth.radius.value;
  const osc = osculatingFrom(out.r, out.v, mu, R);
  const meanView = view(out.meanA, mean.e, mean.i * DEG, mean.raan * DEG, mean.argp * DEG, mean.m * DEG, mu, R);
  const diff = {
    semiMajorAxisKm: osc.semiMajorAxisKm - meanView.semiMajorAxisKm,
    eccentricity: osc.eccentricity - meanView.eccentricity,
    inclinationDeg: osc.inclinationDeg - meanView.inclinationDeg,
    periapsisAltitudeKm: osc.periapsisAltitudeKm - meanView.periapsisAltitudeKm,
  };
  return {
    ...base,
    osculating: osc,
    mean: meanView,
    meanVsOsculating: diff,
    compare: {
      altitudeKm: meanView.semiMajorAxisKm - R,
      periapsisAltitudeKm: meanView.periapsisAltitudeKm,
      apoapsisAltitudeKm: meanView.apoapsisAltitudeKm,
      inclinationDeg: meanView.inclinationDeg,
      eccentricity: meanView.eccentricity,
      periodMin: meanView.periodMin,
      basis: "mean",
    },
    sunSynchronous: sunSync("earth", meanView.semiMajorAxisKm, mean.e, mean.i),
    state: { r: out.r, v: out.v },
    notes: [
      ...notes,
      `Mean (SGP4) and osculating elements differ: for this orbit the osculating semi-major axis is ${signed(diff.semiMajorAxisKm, 1)} km and the inclination ${signed(diff.inclinationDeg, 3)}° from the mean values at epoch. Compare the text with mean values unless it states osculating ones.`,
    ],
  };
}

function signed(x: number, d: number): string {
  return `${x >= 0 ? "+" : "−"}${Math.abs(x).toFixed(d)}`;
}

function fromState(index: number, label: string, state: StateVector, frame: string, timeSystem: string, center: string, notes: string[]): OrbitSummary {
  const body = CENTERS[center.toUpperCase()] ?? null;
  const base = { index, label, epoch: state.epoch.iso, timeSystem, frame, center, basis: "state vector" as const, mean: null, meanVsOsculating: null };
  if (!body)
    return {
      ...base,
      osculating: null,
      compare: null,
      sunSynchronous: null,
      state: { r: state.r, v: state.v },
      notes: [...notes, `No constants for the centre ${center}: elements are not derived.`],
    };
  const b = BODIES[body];
  try {
    const osc = osculatingFrom(state.r, state.v, b.mu.value, b.radius.value);
    return {
      ...base,
      osculating: osc,
      compare: {
        altitudeKm: osc.semiMajorAxisKm - b.radius.value,
        periapsisAltitudeKm: osc.periapsisAltitudeKm,
        apoapsisAltitudeKm: osc.apoapsisAltitudeKm,
        inclinationDeg: osc.inclinationDeg,
        eccentricity: osc.eccentricity,
        periodMin: osc.periodMin,
        basis: "osculating",
      },
      sunSynchronous: sunSync(body, osc.semiMajorAxisKm, osc.eccentricity, osc.inclinationDeg),
      state: { r: state.r, v: state.v },
      notes: [...notes, "Osculating two-body elements of the state at epoch; a mean altitude may differ by several km in low orbits (J2 short-period terms)."],
    };
  } catch (error) {
    return { ...base, osculating: null, compare: null, sunSynchronous: null, state: { r: state.r, v: state.v }, notes: [...notes, (error as Error).message] };
  }
}

/** One summary per orbit the file holds (element sets, OEM segments) — at most `max`. */
export function summarizeOrbitFile(file: OrbitFile, max = 20): OrbitSummary[] {
  try {
    switch (file.format) {
      case "tle":
        return file.sets.slice(0, max).map((s, idx) => {
          const satrec = twoline2satrec(s.line1, s.line2);
          const label = `${s.name ?? "Element set"} (catalogue ${s.catalogNumber})`;
          return withFramesAndTime(
            fromSgp4(idx, label, s.epoch.iso, satrec, { e: s.eccentricity, i: s.inclination, raan: s.raan, argp: s.argPerigee, m: s.meanAnomaly }, "TEME", []),
            s.epoch,
            "UTC",
          );
        });
      case "opm": {
        const c = file.covariance ? sigmasOf(file.covariance.lowerTriangle, file.state.epoch.iso, file.covariance.refFrame) : null;
        return [
          withCovariance(
            withFramesAndTime(
              fromState(0, file.metadata.objectName, file.state, file.metadata.refFrame, file.metadata.timeSystem, file.metadata.centerName, []),
              file.state.epoch,
              file.metadata.timeSystem,
            ),
            c ? { count: 1, first: c, last: c } : null,
          ),
        ];
      }
      case "oem":
        return file.segments.slice(0, max).map((s, idx) =>
          withCovariance(
            withFramesAndTime(
              fromState(idx, `${s.metadata.objectName} (segment ${idx + 1})`, s.first, s.metadata.refFrame, s.metadata.timeSystem, s.metadata.centerName, [
                `First state of ${s.stateCount} in the segment.`,
              ]),
              s.first.epoch,
              s.metadata.timeSystem,
            ),
            s.covariance
              ? {
                  count: s.covarianceCount,
                  first: sigmasOf(s.covariance.first.lowerTriangle, s.covariance.first.epoch.iso, s.covariance.first.refFrame),
                  last: sigmasOf(s.covariance.last.lowerTriangle, s.covariance.last.epoch.iso, s.covariance.last.refFrame),
                }
              : null,
          ),
        );
      case "omm": {
        const c = file.covariance ? sigmasOf(file.covariance.lowerTriangle, file.meanElements.epoch.iso, file.covariance.refFrame) : null;
        return [
          withCovariance(withFramesAndTime(fromOmm(file), file.meanElements.epoch, file.metadata.timeSystem), c ? { count: 1, first: c, last: c } : null),
        ];
      }
    }
  } catch {
    return [];
  }
}

const fixed = (x: number, d: number) => x.toFixed(d);

/**
 * The epoch in UTC and the orbit plane in both frames; the inclination compared with the text
 * (and the sun-synchronous check) is the one against Earth's equator at the epoch, whatever
 * frame the file is written in, so an EME2000 file and an element set of the same orbit agree.
 */
function withFramesAndTime(summary: OrbitSummary, epoch: Epoch, timeSystem: string): OrbitSummary {
  const notes = [...summary.notes];
  const scale = (["UTC", "TAI", "TT"] as const).includes(timeSystem as TimeScale) ? (timeSystem as TimeScale) : null;
  const utc = scale ? toUtc(epoch.ms, scale) : null;
  const utcMs = utc?.ok ? utc.ms : null;
  if (utc && !utc.ok) notes.push(`Epoch not converted to UTC: ${utc.message}.`);
  else if (utc?.ok && scale !== "UTC")
    notes.push(
      `Epoch in UTC: ${isoOf(utc.ms).replace("T", " ")} (${timeSystem} through the leap-second table${scale === "TT" ? "; TT = TAI + 32.184 s" : ""}).`,
    );
  if (utc?.ok && utc.note) notes.push(utc.note);
  const out: OrbitSummary = { ...summary, epochUtc: utcMs !== null ? isoOf(utcMs) : null, planes: null, notes };
  const frame = inertialFrame(summary.frame);
  const plane = summary.compare?.basis === "mean" ? summary.mean : summary.osculating;
  if (!frame || !plane || utcMs === null || summary.center.toUpperCase() !== "EARTH") return out;
  const T = julianCenturiesTT(utcMs);
  if (T === null) return out;
  const m = temeToJ2000Matrix(T);
  const given = { inclinationDeg: plane.inclinationDeg, raanDeg: plane.raanDeg };
  const ofDate = frame === "TEME" ? given : rotatePlane(transpose(m), given.inclinationDeg, given.raanDeg);
  const eme2000 = frame === "TEME" ? rotatePlane(m, given.inclinationDeg, given.raanDeg) : given;
  let stateEme2000: { r: [number, number, number]; v: [number, number, number] } | null = null;
  if (summary.state) {
    const c = convertState(summary.state.r, summary.state.v, summary.frame, "EME2000", utcMs);
    if (c.ok) stateEme2000 = { r: c.r, v: c.v };
  }
  out.planes = { ofDate, eme2000, stateEme2000 };
  if (frame === "TEME")
    notes.push(
      `In EME2000 (J2000) this orbit has inclination ${fixed(eme2000.inclinationDeg, 3)}° and RAAN ${fixed(eme2000.raanDeg, 3)}° (TEME to J2000, IAU-76/FK5; good to about 0.5″).`,
    );
  else {
    notes.push(
      `Against Earth's equator at the epoch (true equator, as element sets are) this orbit has inclination ${fixed(ofDate.inclinationDeg, 3)}° and RAAN ${fixed(ofDate.raanDeg, 3)}°; the text is compared with these (${summary.frame} gives ${fixed(given.inclinationDeg, 3)}°).`,
    );
    if (out.compare) out.compare = { ...out.compare, inclinationDeg: ofDate.inclinationDeg };
    if (out.sunSynchronous && out.compare && plane) {
      const body: BodyName = "earth";
      out.sunSynchronous = sunSync(body, plane.semiMajorAxisKm, plane.eccentricity, ofDate.inclinationDeg);
    }
  }
  return out;
}

function epochInUtc(epoch: Epoch, timeSystem: string): string {
  if (timeSystem !== "TAI" && timeSystem !== "TT") return epoch.iso;
  const utc = toUtc(epoch.ms, timeSystem);
  return utc.ok ? isoOf(utc.ms) : epoch.iso;
}

function fromOmm(file: Extract<OrbitFile, { format: "omm" }>): OrbitSummary {
  const m = file.meanElements;
  const meta = file.metadata;
  const sgp = /SGP/i.test(meta.meanElementTheory) && meta.centerName === "EARTH" && m.meanMotion !== null;
  if (sgp) {
    const tp = file.tleParameters;
    const satrec = json2satrec({
      OBJECT_NAME: meta.objectName,
      OBJECT_ID: meta.objectId,
      // SGP4 counts time in UTC: a TAI or TT epoch goes through the leap-second table first.
      EPOCH: epochInUtc(m.epoch, meta.timeSystem),
      MEAN_MOTION: m.meanMotion!,
      ECCENTRICITY: m.eccentricity,
      INCLINATION: m.inclination,
      RA_OF_ASC_NODE: m.raan,
      ARG_OF_PERICENTER: m.argPericenter,
      MEAN_ANOMALY: m.meanAnomaly,
      NORAD_CAT_ID: tp?.noradCatId ?? 0,
      ELEMENT_SET_NO: tp?.elementSetNo ?? 0,
      BSTAR: tp?.bstar ?? 0,
      MEAN_MOTION_DOT: tp?.meanMotionDot ?? 0,
      MEAN_MOTION_DDOT: tp?.meanMotionDdot ?? 0,
    });
    const s = fromSgp4(
      0,
      meta.objectName,
      m.epoch.iso,
      satrec,
      { e: m.eccentricity, i: m.inclination, raan: m.raan, argp: m.argPericenter, m: m.meanAnomaly },
      meta.refFrame,
      [],
    );
    return { ...s, timeSystem: meta.timeSystem };
  }
  // Another theory: its mean elements are read as two-body elements (mean anomaly through Kepler's equation).
  const body = CENTERS[meta.centerName] ?? null;
  const b = body ? BODIES[body] : null;
  const mu = m.gm ?? b?.mu.value ?? null;
  if (!b || mu === null)
    return {
      index: 0,
      label: meta.objectName,
      epoch: m.epoch.iso,
      timeSystem: meta.timeSystem,
      frame: meta.refFrame,
      center: meta.centerName,
      basis: "mean elements",
      osculating: null,
      mean: null,
      meanVsOsculating: null,
      compare: null,
      sunSynchronous: null,
      state: null,
      notes: [`No constants for the centre ${meta.centerName}: elements are not derived.`],
    };
  // Mean motion n (rev/day) → a = (μ/n²)^(1/3) with n in rad/s.
  const a = m.semiMajorAxis ?? Math.cbrt(mu / ((m.meanMotion! * 2 * Math.PI) / DAY_S) ** 2);
  const E = solveKeplerElliptic(m.meanAnomaly * DEG, m.eccentricity);
  const nu = trueFromEccentric(E, m.eccentricity);
  const st = elementsToState(a * (1 - m.eccentricity ** 2), m.eccentricity, m.inclination * DEG, m.raan * DEG, m.argPericenter * DEG, nu, mu);
  const s = fromState(
    0,
    meta.objectName,
    { epoch: m.epoch, r: [...st.position] as [number, number, number], v: [...st.velocity] as [number, number, number] },
    meta.refFrame,
    meta.timeSystem,
    meta.centerName,
    [`Mean elements of the ${meta.meanElementTheory} theory, read here as two-body elements.`],
  );
  return { ...s, basis: "mean elements" };
}
