/**
 * Plain labels for the contract's code names, for every screen, letter and export: a
 * quantity reads "Periapsis altitude h_p (km)", a kind "Hohmann transfer between planets".
 * The code names stay in the API and the stored data only. Pure: no imports beyond the
 * quantity table, so it runs in the browser and on the server alike.
 */
import { quantityInfo } from "./quantities";

interface Label {
  name: string;
  symbol?: string;
}

const Q: Record<string, Label> = {
  altitude: { name: "Altitude", symbol: "h" },
  periapsisAltitude: { name: "Periapsis altitude", symbol: "h_p" },
  apoapsisAltitude: { name: "Apoapsis altitude", symbol: "h_a" },
  periapsisRadius: { name: "Periapsis radius", symbol: "r_p" },
  apoapsisRadius: { name: "Apoapsis radius", symbol: "r_a" },
  semiMajorAxis: { name: "Semi-major axis", symbol: "a" },
  semiMinorAxis: { name: "Semi-minor axis", symbol: "b" },
  semiLatusRectum: { name: "Semi-latus rectum", symbol: "p" },
  eccentricity: { name: "Eccentricity", symbol: "e" },
  period: { name: "Orbital period", symbol: "T" },
  meanMotion: { name: "Mean motion", symbol: "n" },
  meanMotionRevPerDay: { name: "Mean motion in revolutions per day", symbol: "n" },
  specificEnergy: { name: "Specific orbital energy", symbol: "ε" },
  specificAngularMomentum: { name: "Specific angular momentum", symbol: "h" },
  periapsisSpeed: { name: "Speed at periapsis", symbol: "v_p" },
  apoapsisSpeed: { name: "Speed at apoapsis", symbol: "v_a" },
  hyperbolicExcessSpeed: { name: "Hyperbolic excess speed", symbol: "v∞" },
  orbitType: { name: "Orbit type" },
  radius: { name: "Radius", symbol: "r" },
  speed: { name: "Speed", symbol: "v" },
  flightPathAngle: { name: "Flight-path angle", symbol: "γ" },
  inclination: { name: "Inclination", symbol: "i" },
  raan: { name: "Right ascension of the ascending node", symbol: "Ω" },
  argPeriapsis: { name: "Argument of periapsis", symbol: "ω" },
  trueAnomaly: { name: "True anomaly", symbol: "ν" },
  trueAnomalyFrom: { name: "True anomaly at the start", symbol: "ν₁" },
  trueAnomalyTo: { name: "True anomaly at the end", symbol: "ν₂" },
  meanAnomaly: { name: "Mean anomaly", symbol: "M" },
  eccentricAnomaly: { name: "Eccentric anomaly", symbol: "E" },
  hyperbolicAnomaly: { name: "Hyperbolic anomaly", symbol: "F" },
  position: { name: "Position", symbol: "r⃗" },
  velocity: { name: "Velocity", symbol: "v⃗" },
  position1: { name: "Position at departure", symbol: "r⃗₁" },
  position2: { name: "Position at arrival", symbol: "r⃗₂" },
  velocity1: { name: "Velocity at departure", symbol: "v⃗₁" },
  velocity2: { name: "Velocity at arrival", symbol: "v⃗₂" },
  time: { name: "Elapsed time", symbol: "t" },
  timeOfFlight: { name: "Time of flight", symbol: "Δt" },
  direction: { name: "Direction of motion" },
  transferAngle: { name: "Transfer angle", symbol: "Δν" },
  initialAltitude: { name: "Initial orbit altitude", symbol: "h₁" },
  initialRadius: { name: "Initial orbit radius", symbol: "r₁" },
  finalAltitude: { name: "Final orbit altitude", symbol: "h₂" },
  finalRadius: { name: "Final orbit radius", symbol: "r₂" },
  intermediateAltitude: { name: "Intermediate apoapsis altitude", symbol: "h_b" },
  intermediateRadius: { name: "Intermediate apoapsis radius", symbol: "r_b" },
  deltaV: { name: "Δv", symbol: "Δv" },
  deltaV1: { name: "First burn Δv", symbol: "Δv₁" },
  deltaV2: { name: "Second burn Δv", symbol: "Δv₂" },
  deltaV3: { name: "Third burn Δv", symbol: "Δv₃" },
  deltaVTotal: { name: "Total Δv", symbol: "Δv" },
  transferTime: { name: "Transfer time", symbol: "t_H" },
  transferSemiMajorAxis: { name: "Transfer-orbit semi-major axis", symbol: "a_t" },
  angle: { name: "Plane-change angle", symbol: "Δi" },
  initialSpeed: { name: "Speed before the burn", symbol: "v₁" },
  finalSpeed: { name: "Speed after the burn", symbol: "v₂" },
  specificImpulse: { name: "Specific impulse", symbol: "I_sp" },
  initialMass: { name: "Initial mass", symbol: "m₀" },
  finalMass: { name: "Final mass", symbol: "m_f" },
  propellantMass: { name: "Propellant mass", symbol: "m_p" },
  massRatio: { name: "Mass ratio", symbol: "m₀/m_f" },
  maneuvers: { name: "Manoeuvres" },
  requiredMargin: { name: "Required Δv margin" },
  deltaVRequired: { name: "Δv required" },
  deltaVAvailable: { name: "Δv available" },
  margin: { name: "Δv margin" },
  marginOk: { name: "Margin met" },
  parkingAltitude: { name: "Parking orbit altitude", symbol: "h" },
  c3: { name: "Characteristic energy", symbol: "C3" },
  escapeSpeed: { name: "Escape speed", symbol: "v_esc" },
  circularSpeed: { name: "Circular speed", symbol: "v_c" },
  from: { name: "Departure planet" },
  to: { name: "Arrival planet" },
  departureAltitude: { name: "Departure parking altitude", symbol: "h₁" },
  arrivalAltitude: { name: "Arrival orbit altitude", symbol: "h₂" },
  departureExcessSpeed: { name: "Excess speed at departure", symbol: "v∞₁" },
  departureDeltaV: { name: "Injection Δv at departure", symbol: "Δv₁" },
  arrivalExcessSpeed: { name: "Excess speed at arrival", symbol: "v∞₂" },
  arrivalDeltaV: { name: "Capture Δv at arrival", symbol: "Δv₂" },
  synodicPeriod: { name: "Synodic period", symbol: "T_syn" },
  raanRate: { name: "Nodal drift rate", symbol: "dΩ/dt" },
  argPeriapsisRate: { name: "Periapsis drift rate", symbol: "dω/dt" },
  betaAngle: { name: "Solar beta angle", symbol: "β" },
  eclipseDuration: { name: "Eclipse duration per orbit", symbol: "t_e" },
  eclipseFraction: { name: "Fraction of the orbit in shadow" },
  sunlitFraction: { name: "Fraction of the orbit in sunlight" },
  minimumElevation: { name: "Minimum elevation", symbol: "ε_min" },
  maxPassDuration: { name: "Longest pass duration", symbol: "t_pass" },
  earthCentralAngle: { name: "Central angle of coverage", symbol: "λ" },
  centralAngle: { name: "Central angle of coverage", symbol: "λ" },
  maxSlantRange: { name: "Slant range at minimum elevation", symbol: "ρ" },
  mass: { name: "Spacecraft mass", symbol: "m" },
  dragArea: { name: "Drag area", symbol: "A" },
  dragCoefficient: { name: "Drag coefficient", symbol: "C_D" },
  ballisticCoefficient: { name: "Ballistic coefficient", symbol: "B" },
  lifetimeYears: { name: "Orbital lifetime" },
  deadlineYears: { name: "Disposal deadline" },
  deadlineMet: { name: "Deadline met" },
  targetPerigeeAltitude: { name: "Target perigee altitude", symbol: "h_p" },
  // Ground coverage and links (contactTime, linkBudget, repeatGroundTrack).
  stations: { name: "Ground stations" },
  days: { name: "Span searched" },
  passesPerDay: { name: "Passes per day, mean" },
  passesPerDayMin: { name: "Fewest passes in a day" },
  passesPerDayMax: { name: "Most passes in a day" },
  contactPerDay: { name: "Contact time per day, mean" },
  contactPerDayMin: { name: "Contact time on the least day" },
  longestPass: { name: "Longest pass" },
  shortestPass: { name: "Shortest pass" },
  longestGap: { name: "Longest gap between contacts" },
  dataVolumePerDay: { name: "Data volume per day, mean" },
  dataVolumePerDayMin: { name: "Data volume on the least day" },
  frequency: { name: "Carrier frequency", symbol: "f" },
  transmitPower: { name: "Transmit power", symbol: "P_t" },
  transmitGain: { name: "Transmit antenna gain", symbol: "G_t" },
  transmitDiameter: { name: "Transmit dish diameter", symbol: "D_t" },
  receiveGain: { name: "Receive antenna gain", symbol: "G_r" },
  receiveDiameter: { name: "Receive dish diameter", symbol: "D_r" },
  gOverT: { name: "Receive figure of merit", symbol: "G/T" },
  systemNoiseTemperature: { name: "System noise temperature", symbol: "T_s" },
  antennaEfficiency: { name: "Antenna aperture efficiency", symbol: "η" },
  losses: { name: "Other losses, total (line, pointing, atmosphere, polarisation)" },
  dataRate: { name: "Data rate", symbol: "R" },
  requiredEbN0: { name: "Required Eb/N0" },
  range: { name: "Slant range", symbol: "d" },
  eirp: { name: "EIRP" },
  pathLoss: { name: "Free-space path loss", symbol: "L_fs" },
  cOverN0: { name: "Received C/N0" },
  ebN0: { name: "Received Eb/N0" },
  revolutionsPerCycle: { name: "Revolutions per repeat cycle" },
  daysPerCycle: { name: "Days per repeat cycle" },
  nodalPeriod: { name: "Nodal period", symbol: "T_N" },
  trackSpacing: { name: "Equatorial spacing of adjacent tracks" },
  revolutionsPerDay: { name: "Revolutions per day" },
};

/** Names a kind gives a shared code name in its own sense (linkBudget's `margin` is in dB). */
const KIND_Q: Record<string, Record<string, Label>> = {
  linkBudget: { margin: { name: "Link margin" } },
};

const K: Record<string, string> = {
  orbit: "Orbit shape",
  stateVector: "Elements from a state vector",
  elements: "State vector from elements",
  kepler: "Kepler's equation",
  timeOfFlight: "Time of flight along an orbit",
  propagate: "Two-body propagation",
  hohmann: "Hohmann transfer",
  biElliptic: "Bi-elliptic transfer",
  planeChange: "Plane change",
  rocket: "Rocket equation",
  deltaVBudget: "Δv budget",
  escape: "Escape from a parking orbit",
  interplanetaryHohmann: "Hohmann transfer between planets",
  sphereOfInfluence: "Sphere of influence",
  j2Rates: "J2 drift rates",
  sunSynchronous: "Sun-synchronous inclination",
  lambert: "Lambert transfer",
  eclipse: "Eclipse per orbit",
  groundContact: "Ground-station pass",
  lifetime: "Orbital lifetime",
  disposal: "End-of-life disposal",
  massBudget: "Mass budget",
  contactTime: "Contact time",
  linkBudget: "Link budget",
  repeatGroundTrack: "Repeating ground track",
};

const BODY: Record<string, string> = {
  sun: "Sun",
  mercury: "Mercury",
  venus: "Venus",
  earth: "Earth",
  moon: "Moon",
  mars: "Mars",
  jupiter: "Jupiter",
  saturn: "Saturn",
  uranus: "Uranus",
  neptune: "Neptune",
};

/** "periapsisAltitude" → "periapsis altitude", for names the table does not know yet. */
function words(code: string): string {
  const spaced = code.replace(/([a-z0-9])([A-Z])/g, "$1 $2").toLowerCase();
  return spaced.charAt(0).toUpperCase() + spaced.slice(1);
}

/** The unit as people write it ("" for dimensionless quantities). */
export function displayUnit(unit: string | undefined): string {
  return !unit || unit === "1" ? "" : unit;
}

/** "Periapsis altitude" (no symbol, no unit). */
export function quantityName(code: string): string {
  return Q[code]?.name ?? words(code);
}

/** "Periapsis altitude h_p (km)": name, symbol and unit; `unit` overrides the contract unit. */
export function quantityLabel(code: string, unit?: string, kind?: string): string {
  const l = (kind ? KIND_Q[kind]?.[code] : undefined) ?? Q[code];
  const u = displayUnit(unit ?? quantityInfo(code)?.unit);
  const symbol = l?.symbol && !l.name.split(" ").includes(l.symbol) ? ` ${l.symbol}` : "";
  return `${l?.name ?? words(code)}${symbol}${u ? ` (${u})` : ""}`;
}

/** "Hohmann transfer between planets". */
export function kindLabel(kind: string): string {
  return K[kind] ?? words(kind);
}

/** "Earth"; body override objects read as their name or "custom body". */
export function bodyLabel(body: unknown): string {
  if (typeof body === "string") return BODY[body] ?? words(body);
  if (typeof body === "object" && body !== null && typeof (body as { name?: unknown }).name === "string") {
    const name = (body as { name: string }).name;
    return `${BODY[name] ?? name} (own constants)`;
  }
  return "Custom body";
}

/** What "consistent" answers, and what it does not: shown beside every verdict. */
export const CONSISTENT_MEANS =
  "“Consistent” means the claimed numbers agree with a two-body recomputation under the call's tolerance; it does not say the mission is feasible or compliant.";

/** A hint of a failing check (contract version 2); stored data may hold any shape. */
export interface CheckHint {
  code: string;
  message?: string;
  quantity?: string;
  factor?: number;
  constant?: string;
  value?: number;
}

const near = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b));

/** Which slip a unit factor points at, for a quantity in `unit` (claimed × factor agrees). */
function scaleSlip(factor: number, unit: string): string | null {
  const time: [number, string][] = [
    [60, "minutes"],
    [3600, "hours"],
    [86400, "days"],
  ];
  if (unit === "s") {
    for (const [f, name] of time) {
      if (near(factor, f)) return `it looks like ${name} were written where seconds were meant`;
      if (near(factor, 1 / f)) return `it looks like seconds were written where ${name} were meant`;
    }
  }
  if (near(factor, 0.001)) {
    if (unit === "km") return "it looks like metres were written where kilometres were meant";
    if (unit === "km/s") return "it looks like m/s were written where km/s were meant";
    if (unit === "kg") return "it looks like grams were written where kilograms were meant";
  }
  if (near(factor, 1000)) {
    if (unit === "km") return "it looks like thousands of kilometres were written where kilometres were meant";
    if (unit === "km/s") return "it looks like a value a thousand times too small: check km/s against m/s";
    if (unit === "kg") return "it looks like tonnes were written where kilograms were meant";
  }
  return null;
}

function factorText(f: number): string {
  if (f >= 1) return `× ${Number(f.toPrecision(6))}`;
  return `÷ ${Number((1 / f).toPrecision(6))}`;
}

/**
 * A hint as a plain sentence: "Orbital period: it looks like minutes were written where
 * seconds were meant." Unknown codes (stored by a later engine, or damaged) fall back to
 * the engine's own message, never to an error.
 */
export function hintSentence(hint: unknown, quantity?: string, unit?: string): string | null {
  if (typeof hint !== "object" || hint === null) return null;
  const h = hint as CheckHint;
  const what = quantity ? `${quantityName(quantity)}: ` : "";
  const u = unit ?? (quantity ? (quantityInfo(quantity)?.unit ?? "") : "");
  const message = typeof h.message === "string" && h.message.trim() ? h.message.trim() : null;
  const sentence = (s: string) => `${what}${s.charAt(0).toUpperCase()}${s.slice(1)}${/[.!?]$/.test(s) ? "" : "."}`;
  switch (h.code) {
    case "other-quantity":
      return sentence(
        typeof h.quantity === "string"
          ? `the claimed value matches the recomputed ${quantityName(h.quantity).toLowerCase()}; the two may have been swapped`
          : "the claimed value matches another recomputed quantity; two values may have been swapped",
      );
    case "altitude-radius":
      return sentence("the claim agrees once the body's radius is added or taken away: an altitude may have been given for a radius, or the reverse");
    case "unit-scale": {
      const f = typeof h.factor === "number" && Number.isFinite(h.factor) && h.factor !== 0 ? h.factor : null;
      const slip = f !== null ? scaleSlip(f, u) : null;
      return sentence(
        slip ??
          (f !== null
            ? `the claim agrees when multiplied ${factorText(f)}: check the unit it was written in`
            : "the claim agrees in another unit: check the unit it was written in"),
      );
    }
    case "degrees-radians":
      return sentence("the value looks like radians where degrees were meant (it agrees when multiplied by 180/π)");
    case "solar-day":
      return sentence("it looks like a solar day (86 400 s) was used where a sidereal day was meant, or the reverse");
    case "standard-gravity":
      return sentence("the claim agrees with standard gravity g₀ left out or rounded to 9.81 m/s² instead of 9.806 65 m/s²");
    case "sign":
      return sentence("the claim agrees with the opposite sign: check the sign convention (a hyperbola's semi-major axis is negative)");
    case "other-constants":
      return sentence(
        typeof h.constant === "string"
          ? `the claim agrees with another commonly used constant (${h.constant}${typeof h.value === "number" ? ` = ${h.value}` : ""}); the call's checks use the documented constants table`
          : "the claim agrees with another commonly used constant; the call's checks use the documented constants table",
      );
    default:
      return message ? sentence(message) : null;
  }
}

/** The rule a check passed or failed on, in words. */
export function basisText(basis: unknown): string | null {
  if (basis === "relative") return "relative bound";
  if (basis === "absolute") return "absolute bound";
  if (basis === "precision") return "precision as written";
  if (basis === "exact") return "exact match";
  return null;
}

/** A tolerance policy in words: "checked at 0.1 %, angles 0.05°". */
export function policySummary(tolerance: { relative?: number; absolute?: Record<string, number | undefined> } | undefined): string {
  const relative = tolerance?.relative ?? 0.001;
  const deg = tolerance?.absolute?.deg ?? 0.05;
  const pct = Number((relative * 100).toPrecision(6));
  return `checked at ${pct} %, angles ${Number(deg.toPrecision(6))}°`;
}

/**
 * A sentence of the engine's that names quantities by code ("two of periapsisAltitude,
 * apoapsisAltitude…") with the plain names instead ("two of periapsis altitude, …").
 */
export function plainQuantities(text: string): string {
  return text.replace(/\b[a-z][a-z0-9]*[A-Z][A-Za-z0-9]*\b/g, (code) => (Q[code] ? quantityName(code).toLowerCase() : code));
}
