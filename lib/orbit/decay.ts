/**
 * Orbital decay under atmospheric drag: the orbit-averaged change of the semi-major axis
 * and eccentricity, integrated until the perigee falls below 100 km.
 *
 * Method: Gauss's variational equations with drag as the only perturbation (tangential,
 * non-rotating atmosphere), averaged over one revolution by quadrature in the eccentric
 * anomaly, as in King-Hele, "Satellite Orbits in an Atmosphere: Theory and Applications"
 * (1987), and Vallado, "Fundamentals of Astrodynamics and Applications", §9 (orbit decay).
 * Density from ./atmosphere.ts. Integration: midpoint (second-order Runge–Kutta) with a
 * step chosen so the perigee moves at most a tenth of the local scale height per step; the
 * quadrature uses more points as the orbit's eccentricity concentrates the drag at perigee.
 */
import { density, scaleHeight, type SolarActivity } from "./atmosphere";
import { fail, fmt } from "./errors";

export const REENTRY_PERIGEE_KM = 100;
/** Integration stops here; longer lifetimes are reported as "more than". */
export const LIFETIME_HORIZON_YEARS = 1000;
const SECONDS_PER_YEAR = 365.25 * 86400;

export interface DecayInput {
  /** km³/s² */
  mu: number;
  /** Body radius, km. */
  radius: number;
  /** Semi-major axis, km. */
  a: number;
  e: number;
  /** m/(Cd·A), kg/m². */
  ballisticCoefficient: number;
  solarActivity: SolarActivity;
  /** Stop when the perigee altitude is below this (km); 100 km by default. */
  stopPerigeeAltitude?: number;
}

export interface DecaySample {
  years: number;
  periapsisAltitude: number;
  apoapsisAltitude: number;
}

export interface DecayResult {
  lifetimeYears: number;
  /** False when the orbit is still above the stop altitude at the horizon. */
  reentered: boolean;
  /** About 50 samples evenly spaced in time, first at 0 and last at the end. */
  profile: DecaySample[];
  steps: number;
}

/** Orbit-averaged da/dt (km/s) and de/dt (1/s). */
export function decayRates(mu: number, R: number, a: number, e: number, B: number, activity: SolarActivity): { da: number; de: number } {
  const muSi = mu * 1e9;
  const aSi = a * 1000;
  // Points in E: enough to resolve the drag peak at perigee, of width about √(H/(a·e)) rad.
  const Hp = scaleHeight(a * (1 - e) - R, activity);
  const n = e < 1e-6 ? 1 : Math.min(256, 8 + 4 * Math.ceil(2 * Math.sqrt((a * e) / Hp)));
  let da = 0;
  let de = 0;
  for (let k = 0; k < n; k++) {
    const E = (2 * Math.PI * (k + 0.5)) / n;
    const cosE = Math.cos(E);
    const oneMinus = 1 - e * cosE;
    // Radius from the eccentric anomaly r = a(1 − e cos E).
    const r = aSi * oneMinus;
    // Vis-viva v² = μ(2/r − 1/a).
    const v = Math.sqrt(muSi * (2 / r - 1 / aSi));
    const rho = density(r / 1000 - R, activity);
    // Gauss, tangential drag f = −ρv²/(2B): da/dt = −a²ρv³/(μB), de/dt = −(e + cos ν)ρv/B.
    const daInst = (-(aSi * aSi) * rho * v * v * v) / (muSi * B);
    // cos ν = (cos E − e)/(1 − e cos E).
    const cosNu = (cosE - e) / oneMinus;
    const deInst = (-(e + cosNu) * rho * v) / B;
    // Mean over the mean anomaly: dM = (1 − e cos E) dE.
    da += daInst * oneMinus;
    de += deInst * oneMinus;
  }
  return { da: da / n / 1000, de: de / n };
}

/** Integrates the decay of an orbit until its perigee falls below the stop altitude. */
export function decayOrbit(input: DecayInput): DecayResult {
  const { mu, radius: R, ballisticCoefficient: B, solarActivity } = input;
  const stop = input.stopPerigeeAltitude ?? REENTRY_PERIGEE_KM;
  if (!(B > 0)) fail(`the ballistic coefficient must be positive (got ${fmt(B)} kg/m²)`);
  let a = input.a;
  let e = input.e;
  if (!(a > R) || !(e >= 0 && e < 1)) fail("the orbit must be closed and above the surface to decay");
  const hp0 = a * (1 - e) - R;
  if (hp0 < stop) fail(`the perigee is at ${fmt(hp0, 4)} km, already below ${fmt(stop, 4)} km: the orbit has decayed; give the orbit before re-entry`);
  const horizon = LIFETIME_HORIZON_YEARS * SECONDS_PER_YEAR;
  const raw: DecaySample[] = [{ years: 0, periapsisAltitude: hp0, apoapsisAltitude: a * (1 + e) - R }];
  let t = 0;
  let steps = 0;
  const stepFor = (r: { da: number; de: number }, aa: number, ee: number) => {
    // Perigee and apogee rates: r_p = a(1 − e), r_a = a(1 + e).
    const drp = Math.abs(r.da * (1 - ee) - aa * r.de);
    const dra = Math.abs(r.da * (1 + ee) + aa * r.de);
    const maxPerigeeStep = Math.max(0.5, 0.1 * scaleHeight(aa * (1 - ee) - R, solarActivity));
    const maxApogeeStep = Math.max(maxPerigeeStep, 0.05 * 2 * aa * ee);
    return Math.min(drp > 0 ? maxPerigeeStep / drp : Infinity, dra > 0 ? maxApogeeStep / dra : Infinity, horizon);
  };
  while (steps < 100_000) {
    const r1 = decayRates(mu, R, a, e, B, solarActivity);
    let dt = stepFor(r1, a, e);
    if (t + dt > horizon) dt = horizon - t;
    // Midpoint rule (second-order Runge–Kutta).
    const am = a + 0.5 * dt * r1.da;
    const em = Math.max(0, e + 0.5 * dt * r1.de);
    const r2 = decayRates(mu, R, am, em, B, solarActivity);
    const aNext = a + dt * r2.da;
    const eNext = Math.max(0, e + dt * r2.de);
    steps++;
    const hpNext = aNext * (1 - eNext) - R;
    if (hpNext < stop || !Number.isFinite(hpNext)) {
      // Interpolate the crossing time within the step.
      const hpNow = a * (1 - e) - R;
      const frac = Number.isFinite(hpNext) && hpNow !== hpNext ? Math.min(1, Math.max(0, (hpNow - stop) / (hpNow - hpNext))) : 1;
      t += frac * dt;
      raw.push({ years: t / SECONDS_PER_YEAR, periapsisAltitude: stop, apoapsisAltitude: a * (1 + e) - R + frac * (aNext * (1 + eNext) - a * (1 + e)) });
      return { lifetimeYears: t / SECONDS_PER_YEAR, reentered: true, profile: resample(raw), steps };
    }
    a = aNext;
    e = eNext;
    t += dt;
    raw.push({ years: t / SECONDS_PER_YEAR, periapsisAltitude: hpNext, apoapsisAltitude: a * (1 + e) - R });
    if (t >= horizon) break;
  }
  return { lifetimeYears: t / SECONDS_PER_YEAR, reentered: false, profile: resample(raw), steps };
}

/** Resamples a decay history to about 50 points evenly spaced in time (linear interpolation). */
function resample(raw: DecaySample[], count = 50): DecaySample[] {
  const end = raw[raw.length - 1]!.years;
  if (raw.length <= 2 || end === 0) return raw;
  const out: DecaySample[] = [];
  let j = 0;
  for (let i = 0; i < count; i++) {
    const t = (end * i) / (count - 1);
    while (j < raw.length - 2 && raw[j + 1]!.years < t) j++;
    const p = raw[j]!;
    const q = raw[j + 1]!;
    const f = q.years === p.years ? 0 : (t - p.years) / (q.years - p.years);
    out.push({
      years: t,
      periapsisAltitude: p.periapsisAltitude + f * (q.periapsisAltitude - p.periapsisAltitude),
      apoapsisAltitude: p.apoapsisAltitude + f * (q.apoapsisAltitude - p.apoapsisAltitude),
    });
  }
  return out;
}
