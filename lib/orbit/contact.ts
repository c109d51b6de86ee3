/**
 * Ground-station contact over a span of days: the orbit is propagated as a two-body ellipse
 * whose node, perigee and mean anomaly drift at the first-order J2 secular rates, the body
 * turns under it, and each rise and set is found to better than a second by bisection on the
 * elevation above the station's mask. Angles in rad and times in s inside.
 *
 * Search: the step from one elevation sample to the next is the angular distance to the edge
 * of the station's visibility circle divided by an upper bound of how fast that distance can
 * change, so no pass longer than the smallest step (1 s) is stepped over; steps never go
 * below 1 s and the number of samples is capped, so the search always ends.
 */
import { solveKeplerElliptic } from "./anomalies/kepler";
import { fail, fmt } from "./errors";
import { j2SecularRates } from "./j2";

export interface ContactBody {
  mu: number;
  radius: number;
  j2: number;
  /** Radius the J2 value was published with (defaults to radius). */
  j2ReferenceRadius?: number;
  rotationRate: number;
}

/** Osculating-at-zero elements of the orbit (rad, km); time zero is this state. */
export interface ContactOrbit {
  a: number;
  e: number;
  i: number;
  raan: number;
  argPeriapsis: number;
  trueAnomaly: number;
}

/** A station on the spherical body (deg, km). */
export interface Station {
  name: string;
  latitude: number;
  longitude: number;
  altitude: number;
  minimumElevation: number;
}

export interface Pass {
  station: string;
  /** Seconds from time zero. */
  rise: number;
  set: number;
  /** The pass was already under way at the start of the span. */
  openAtStart: boolean;
  /** The pass was still under way at the end of the span. */
  openAtEnd: boolean;
}

export interface Interval {
  start: number;
  end: number;
  openAtStart: boolean;
  openAtEnd: boolean;
}

/** Largest number of elevation samples one station's search may take. */
export const MAX_SAMPLES_PER_STATION = 2_000_000;
/** Bisection steps per rise or set (the bracket starts at most a few thousand seconds wide). */
const MAX_BISECTIONS = 40;
/** Rise and set times are found to this width, s. */
const ROOT_WIDTH = 0.05;
const MIN_STEP = 1;
const MAX_STEP = 3600;

/** Sets up the propagation of one orbit with J2 secular drift. */
export function secularPropagator(body: ContactBody, orbit: ContactOrbit) {
  const { a, e, i } = orbit;
  if (!(a > 0) || !(e >= 0 && e < 1)) fail(`contact needs a closed orbit (a > 0, 0 ≤ e < 1); got a = ${fmt(a)} km, e = ${fmt(e)}`);
  const refR = body.j2ReferenceRadius ?? body.radius;
  // Mean motion n = √(μ/a³).
  const n = Math.sqrt(body.mu / (a * a * a));
  const rates = j2SecularRates(body.mu, refR, body.j2, a, e, i);
  const p = a * (1 - e * e);
  const sq = Math.sqrt(1 - e * e);
  // First-order J2 secular rate of the mean anomaly (Vallado, Fundamentals of Astrodynamics
  // and Applications, §9.6): Ṁ = n [1 + (3/4) J2 (R/p)² √(1 − e²) (3cos²i − 1)].
  const mDot = n * (1 + 0.75 * body.j2 * (refR / p) ** 2 * sq * (3 * Math.cos(i) ** 2 - 1));
  // Mean anomaly at time zero from the true anomaly: tan(E/2) = √((1−e)/(1+e)) tan(θ/2), M = E − e sin E.
  const E0 = 2 * Math.atan2(Math.sqrt(1 - e) * Math.sin(orbit.trueAnomaly / 2), Math.sqrt(1 + e) * Math.cos(orbit.trueAnomaly / 2));
  const M0 = E0 - e * Math.sin(E0);
  const ci = Math.cos(i);
  const si = Math.sin(i);
  const h = Math.sqrt(body.mu * p);
  const rp = a * (1 - e);
  const ra = a * (1 + e);
  /** Position at time t in the body-fixed frame (prime meridian along inertial x at t = 0). */
  const fixedPosition = (t: number, out: Float64Array): void => {
    const M = M0 + mDot * t;
    const E = e === 0 ? M : solveKeplerElliptic(M, e);
    const cE = Math.cos(E);
    const sE = Math.sin(E);
    // Perifocal coordinates: x = a(cos E − e), y = a√(1 − e²) sin E.
    const xp = a * (cE - e);
    const yp = a * sq * sE;
    const W = orbit.raan + rates.raanRate * t;
    const w = orbit.argPeriapsis + rates.argPeriapsisRate * t;
    const cW = Math.cos(W);
    const sW = Math.sin(W);
    const cw = Math.cos(w);
    const sw = Math.sin(w);
    // Perifocal → inertial: R3(−Ω) R1(−i) R3(−ω) (Vallado §2.6).
    const x = (cW * cw - sW * sw * ci) * xp + (-cW * sw - sW * cw * ci) * yp;
    const y = (sW * cw + cW * sw * ci) * xp + (-sW * sw + cW * cw * ci) * yp;
    const z = sw * si * xp + cw * si * yp;
    // Inertial → body-fixed: rotation by −ω⊕ t about z.
    const th = body.rotationRate * t;
    const c = Math.cos(th);
    const s = Math.sin(th);
    out[0] = c * x + s * y;
    out[1] = -s * x + c * y;
    out[2] = z;
  };
  // Upper bound of the angular rate of the satellite's direction seen from the centre, in the body frame.
  const angularRateBound = (h / (rp * rp)) * Math.abs(mDot / n) + Math.abs(rates.raanRate) + Math.abs(rates.argPeriapsisRate) + Math.abs(body.rotationRate);
  return { fixedPosition, rp, ra, h, angularRateBound };
}

/** Station position in the body-fixed frame on a sphere of the body's radius. */
function stationVector(body: ContactBody, s: Station): [number, number, number, number] {
  const lat = (s.latitude * Math.PI) / 180;
  const lon = (s.longitude * Math.PI) / 180;
  const rs = body.radius + s.altitude;
  return [Math.cos(lat) * Math.cos(lon), Math.cos(lat) * Math.sin(lon), Math.sin(lat), rs];
}

/** Checks a station's fields; throws an OrbitInputError that names the station and the fix. */
export function validateStation(s: Station, label: string): void {
  if (!(s.latitude >= -90 && s.latitude <= 90)) fail(`${label}: latitude must lie between −90° and 90° (got ${fmt(s.latitude)}°)`);
  if (!(s.longitude >= -360 && s.longitude <= 360)) fail(`${label}: longitude must lie between −180° and 180° (east positive; got ${fmt(s.longitude)}°)`);
  if (!(s.minimumElevation >= 0 && s.minimumElevation < 90))
    fail(`${label}: minimum elevation must be at least 0° and below 90° (got ${fmt(s.minimumElevation)}°); a station sees nothing at 90° or above`);
  if (!(s.altitude >= -25 && s.altitude <= 10))
    fail(`${label}: altitude must be between −25 and 10 km above the sphere of the equatorial radius (got ${fmt(s.altitude)} km); give it in km`);
}

/**
 * Every pass of the orbit over one station within [0, span] s. Rise and set are found by
 * bisection on (elevation − mask) to within 0.05 s.
 */
export function stationPasses(body: ContactBody, orbit: ContactOrbit, station: Station, span: number): Pass[] {
  const prop = secularPropagator(body, orbit);
  const [ux, uy, uz, rs] = stationVector(body, station);
  const eps = (station.minimumElevation * Math.PI) / 180;
  const cosEps = Math.cos(eps);
  if (prop.ra <= rs) return []; // never above the station's horizon
  const pos = new Float64Array(3);
  // Elevation above the mask: sin el = (r − r_s)·û_s / |r − r_s|.
  const elevation = (t: number): number => {
    prop.fixedPosition(t, pos);
    const dx = pos[0]! - ux * rs;
    const dy = pos[1]! - uy * rs;
    const dz = pos[2]! - uz * rs;
    const d = Math.sqrt(dx * dx + dy * dy + dz * dz);
    return Math.asin((dx * ux + dy * uy + dz * uz) / d) - eps;
  };
  // Distance in central angle to the edge of the visibility circle (positive = in view):
  // λ(r) = arccos((r_s/r) cos ε) − ε (spherical-body geometry, Wertz & Larson, SMAD ch. 5), g = λ − ψ.
  const edge = (t: number): number => {
    prop.fixedPosition(t, pos);
    const r = Math.sqrt(pos[0]! * pos[0]! + pos[1]! * pos[1]! + pos[2]! * pos[2]!);
    const cosPsi = Math.max(-1, Math.min(1, (pos[0]! * ux + pos[1]! * uy + pos[2]! * uz) / r));
    const q = (rs / r) * cosEps;
    const lam = q >= 1 ? -eps : Math.acos(q) - eps;
    return lam - Math.acos(cosPsi);
  };
  // |dλ/dt| ≤ (r_s cos ε / (r² sin(λ + ε))) |ṙ|, largest at periapsis; |ṙ| ≤ μ e / h.
  const qp = (rs / prop.rp) * cosEps;
  const lamRateBound = orbit.e > 0 ? (qp < 1 ? ((rs * cosEps) / (prop.rp * prop.rp * Math.sqrt(1 - qp * qp))) * ((body.mu * orbit.e) / prop.h) : Infinity) : 0;
  const K = 1.1 * (prop.angularRateBound + (Number.isFinite(lamRateBound) ? lamRateBound : 0));
  // Below the mask everywhere near periapsis the λ bound is infinite: fall back to the smallest step there.
  const stepFrom = (g: number) => (Number.isFinite(lamRateBound) ? Math.min(MAX_STEP, Math.max(MIN_STEP, Math.abs(g) / K)) : MIN_STEP);
  const bisect = (lo: number, hi: number, rising: boolean): number => {
    for (let k = 0; k < MAX_BISECTIONS && hi - lo > ROOT_WIDTH; k++) {
      const mid = (lo + hi) / 2;
      const up = elevation(mid) >= 0;
      if (up === rising) hi = mid;
      else lo = mid;
    }
    return (lo + hi) / 2;
  };
  const passes: Pass[] = [];
  let t = 0;
  let inView = elevation(0) >= 0;
  let riseAt = 0;
  let openAtStart = inView;
  let samples = 0;
  while (t < span) {
    if (++samples > MAX_SAMPLES_PER_STATION)
      fail(`the contact search for station ${station.name} took more than ${MAX_SAMPLES_PER_STATION} samples; shorten the span or check the orbit`);
    const g = edge(t);
    const next = Math.min(span, t + stepFrom(g));
    const up = elevation(next) >= 0;
    if (up !== inView) {
      const at = bisect(t, next, up);
      if (up) {
        riseAt = at;
        openAtStart = false;
      } else {
        passes.push({ station: station.name, rise: riseAt, set: at, openAtStart, openAtEnd: false });
        openAtStart = false;
      }
      inView = up;
    }
    t = next;
  }
  if (inView) passes.push({ station: station.name, rise: riseAt, set: span, openAtStart, openAtEnd: true });
  return passes;
}

/** Union of contact intervals (several stations combine into one figure). */
export function unionOfPasses(passes: readonly Pass[]): Interval[] {
  const sorted = [...passes].sort((x, y) => x.rise - y.rise);
  const out: Interval[] = [];
  for (const p of sorted) {
    const last = out[out.length - 1];
    if (last && p.rise <= last.end) {
      if (p.set > last.end) {
        last.end = p.set;
        last.openAtEnd = p.openAtEnd;
      }
      last.openAtEnd = last.openAtEnd || p.openAtEnd;
    } else out.push({ start: p.rise, end: p.set, openAtStart: p.openAtStart, openAtEnd: p.openAtEnd });
  }
  return out;
}

export interface ContactStatistics {
  passesPerDay: number;
  passesPerDayMin: number;
  passesPerDayMax: number;
  /** s per day. */
  contactPerDay: number;
  contactPerDayMin: number;
  /** s; undefined when there is no contact. */
  longestPass?: number;
  shortestPass?: number;
  /** Longest time without contact within the span, its ends included, s. */
  longestGap: number;
  totalContact: number;
  passCount: number;
}

/**
 * Daily figures of a list of contact intervals over `days` whole days. A pass counts in the
 * day it rises; contact time is split at midnight. Passes cut by the span's ends count but
 * are left out of the longest and shortest pass unless nothing else exists.
 */
export function contactStatistics(intervals: readonly Interval[], days: number): ContactStatistics {
  const DAY = 86_400;
  const perDayCount = new Array<number>(days).fill(0);
  const perDayTime = new Array<number>(days).fill(0);
  for (const iv of intervals) {
    perDayCount[Math.min(days - 1, Math.floor(iv.start / DAY))]! += 1;
    for (let d = Math.floor(iv.start / DAY); d < days && d * DAY < iv.end; d++) {
      perDayTime[d]! += Math.min(iv.end, (d + 1) * DAY) - Math.max(iv.start, d * DAY);
    }
  }
  const whole = intervals.filter((iv) => !iv.openAtStart && !iv.openAtEnd);
  const forExtremes = whole.length > 0 ? whole : intervals;
  const durations = forExtremes.map((iv) => iv.end - iv.start);
  let longestGap = 0;
  let last = 0;
  for (const iv of intervals) {
    longestGap = Math.max(longestGap, iv.start - last);
    last = iv.end;
  }
  longestGap = Math.max(longestGap, days * DAY - last);
  const total = perDayTime.reduce((s, x) => s + x, 0);
  return {
    passesPerDay: intervals.length / days,
    passesPerDayMin: Math.min(...perDayCount),
    passesPerDayMax: Math.max(...perDayCount),
    contactPerDay: total / days,
    contactPerDayMin: Math.min(...perDayTime),
    longestPass: durations.length > 0 ? Math.max(...durations) : undefined,
    shortestPass: durations.length > 0 ? Math.min(...durations) : undefined,
    longestGap,
    totalContact: total,
    passCount: intervals.length,
  };
}

/** Sub-satellite points (deg) every `step` s over [from, to], for a ground-track map. */
export function groundTrack(body: ContactBody, orbit: ContactOrbit, from: number, to: number, step: number): { t: number; lat: number; lon: number }[] {
  const prop = secularPropagator(body, orbit);
  const pos = new Float64Array(3);
  const out: { t: number; lat: number; lon: number }[] = [];
  const n = Math.min(100_000, Math.max(1, Math.ceil((to - from) / step)));
  for (let k = 0; k <= n; k++) {
    const t = from + ((to - from) * k) / n;
    prop.fixedPosition(t, pos);
    // Geocentric latitude and longitude of the position vector.
    const lat = (Math.atan2(pos[2]!, Math.hypot(pos[0]!, pos[1]!)) * 180) / Math.PI;
    const lon = (Math.atan2(pos[1]!, pos[0]!) * 180) / Math.PI;
    out.push({ t, lat, lon });
  }
  return out;
}
