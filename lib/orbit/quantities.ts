/**
 * Every quantity name the engine knows, with its unit and value type. A name means the
 * same thing, in the same unit, in every kind that uses it.
 */

export type QuantityType = "number" | "vector" | "text" | "boolean" | "body" | "maneuvers" | "phases" | "massItems" | "table" | "stations";

export interface QuantityInfo {
  unit: string;
  type: QuantityType;
  /** Angles compared modulo 360°. */
  periodicAngle?: boolean;
  description: string;
}

/** The unit of dimensionless quantities (SI writes it as 1). */
export const DIMENSIONLESS = "1";

const n = (unit: string, description: string, periodicAngle = false): QuantityInfo => ({ unit, type: "number", description, periodicAngle });

export const QUANTITIES = {
  // Orbit shape
  altitude: n("km", "altitude of a circular orbit above the equatorial radius"),
  periapsisAltitude: n("km", "periapsis altitude above the equatorial radius"),
  apoapsisAltitude: n("km", "apoapsis altitude above the equatorial radius"),
  periapsisRadius: n("km", "periapsis radius from the body's centre"),
  apoapsisRadius: n("km", "apoapsis radius from the body's centre"),
  semiMajorAxis: n("km", "semi-major axis (negative for hyperbolas)"),
  semiMinorAxis: n("km", "semi-minor axis of a closed orbit"),
  semiLatusRectum: n("km", "semi-latus rectum p = h²/μ"),
  eccentricity: n(DIMENSIONLESS, "eccentricity"),
  period: n("s", "orbital period of a closed orbit"),
  meanMotion: n("deg/s", "mean motion √(μ/|a|³)"),
  meanMotionRevPerDay: n("rev/day", "mean motion in revolutions per day (86 400 s / period)"),
  specificEnergy: n("km²/s²", "specific orbital energy v²/2 − μ/r"),
  specificAngularMomentum: n("km²/s", "magnitude of the specific angular momentum r × v"),
  periapsisSpeed: n("km/s", "speed at periapsis"),
  apoapsisSpeed: n("km/s", "speed at apoapsis"),
  hyperbolicExcessSpeed: n("km/s", "hyperbolic excess speed v∞"),
  orbitType: { unit: "", type: "text", description: "circular, elliptic, parabolic or hyperbolic" } as QuantityInfo,
  radius: n("km", "distance from the body's centre (for sphereOfInfluence: the sphere's radius)"),
  speed: n("km/s", "speed"),
  flightPathAngle: n("deg", "angle of the velocity above the local horizontal"),
  // Angles and elements
  inclination: n("deg", "inclination of the orbit plane to the body's equator"),
  raan: n("deg", "right ascension of the ascending node", true),
  argPeriapsis: n("deg", "argument of periapsis", true),
  trueAnomaly: n("deg", "true anomaly", true),
  trueAnomalyFrom: n("deg", "true anomaly at the start", false),
  trueAnomalyTo: n("deg", "true anomaly at the end", false),
  meanAnomaly: n("deg", "mean anomaly (hyperbolic mean anomaly when e > 1)", true),
  eccentricAnomaly: n("deg", "eccentric anomaly", true),
  hyperbolicAnomaly: n("deg", "hyperbolic anomaly (expressed in degrees)"),
  position: { unit: "km", type: "vector", description: "position [x, y, z] in an inertial frame centred on the body" } as QuantityInfo,
  velocity: { unit: "km/s", type: "vector", description: "velocity [vx, vy, vz] in the same frame" } as QuantityInfo,
  position1: { unit: "km", type: "vector", description: "position at departure" } as QuantityInfo,
  position2: { unit: "km", type: "vector", description: "position at arrival" } as QuantityInfo,
  velocity1: { unit: "km/s", type: "vector", description: "velocity at departure on the transfer arc" } as QuantityInfo,
  velocity2: { unit: "km/s", type: "vector", description: "velocity at arrival on the transfer arc" } as QuantityInfo,
  time: n("s", "elapsed time"),
  timeOfFlight: n("s", "time of flight"),
  direction: { unit: "", type: "text", description: "prograde (default) or retrograde" } as QuantityInfo,
  transferAngle: n("deg", "transfer angle swept between the two positions"),
  // Maneuvers
  initialAltitude: n("km", "altitude of the initial circular orbit"),
  initialRadius: n("km", "radius of the initial circular orbit"),
  finalAltitude: n("km", "altitude of the final circular orbit"),
  finalRadius: n("km", "radius of the final circular orbit"),
  intermediateAltitude: n("km", "altitude of the intermediate apoapsis of a bi-elliptic transfer"),
  intermediateRadius: n("km", "radius of the intermediate apoapsis of a bi-elliptic transfer"),
  deltaV: n("km/s", "velocity change (magnitude)"),
  deltaV1: n("km/s", "first burn"),
  deltaV2: n("km/s", "second burn"),
  deltaV3: n("km/s", "third burn"),
  deltaVTotal: n("km/s", "sum of the burns"),
  transferTime: n("s", "time of flight on the transfer"),
  transferSemiMajorAxis: n("km", "semi-major axis of the transfer ellipse"),
  angle: n("deg", "plane-change angle"),
  initialSpeed: n("km/s", "speed before the burn"),
  finalSpeed: n("km/s", "speed after the burn"),
  // Propulsion
  specificImpulse: n("s", "specific impulse"),
  initialMass: n("kg", "mass before the burns"),
  finalMass: n("kg", "mass after the burns"),
  propellantMass: n("kg", "propellant consumed"),
  massRatio: n(DIMENSIONLESS, "initial mass / final mass"),
  maneuvers: { unit: "km/s", type: "maneuvers", description: "list of { name, deltaV } with deltaV in km/s" } as QuantityInfo,
  requiredMargin: n(DIMENSIONLESS, "required Δv margin as a fraction of the requirement (0.1 = 10 %)"),
  deltaVRequired: n("km/s", "sum of the budgeted maneuvers"),
  deltaVAvailable: n("km/s", "Δv the vehicle can deliver (rocket equation)"),
  margin: n(DIMENSIONLESS, "(available − required) / required"),
  marginOk: { unit: "", type: "boolean", description: "margin at least the required margin" } as QuantityInfo,
  // Escape and interplanetary
  parkingAltitude: n("km", "altitude of the circular parking orbit"),
  c3: n("km²/s²", "characteristic energy C3 = v∞²"),
  escapeSpeed: n("km/s", "escape speed at the parking radius"),
  circularSpeed: n("km/s", "circular speed at the parking radius"),
  from: { unit: "", type: "body", description: "departure planet (name or override object)" } as QuantityInfo,
  to: { unit: "", type: "body", description: "arrival planet (name or override object)" } as QuantityInfo,
  departureAltitude: n("km", "altitude of the circular parking orbit at departure"),
  arrivalAltitude: n("km", "altitude of the circular capture orbit at arrival"),
  departureExcessSpeed: n("km/s", "hyperbolic excess speed at departure"),
  departureDeltaV: n("km/s", "injection Δv from the parking orbit"),
  arrivalExcessSpeed: n("km/s", "hyperbolic excess speed at arrival"),
  arrivalDeltaV: n("km/s", "capture Δv into the circular arrival orbit"),
  synodicPeriod: n("s", "synodic period of the two planets"),
  // Perturbations and operations
  raanRate: n("deg/day", "secular rate of the right ascension of the ascending node"),
  argPeriapsisRate: n("deg/day", "secular rate of the argument of periapsis"),
  betaAngle: n("deg", "solar beta angle (sun elevation above the orbit plane)"),
  eclipseDuration: n("s", "time in shadow per orbit"),
  eclipseFraction: n(DIMENSIONLESS, "fraction of the orbit in shadow"),
  sunlitFraction: n(DIMENSIONLESS, "fraction of the orbit in sunlight"),
  minimumElevation: n("deg", "minimum elevation angle at the ground station"),
  maxPassDuration: n("s", "duration of an overhead pass"),
  centralAngle: n("deg", "central angle at the body's centre from the sub-satellite point to the edge of coverage"),
  earthCentralAngle: n("deg", "old name of centralAngle (contract version 1), accepted and emitted for one more version"),
  maxSlantRange: n("km", "slant range at the minimum elevation"),
  // Coverage and links (contactTime, linkBudget, repeatGroundTrack)
  stations: {
    unit: "",
    type: "stations",
    description: "ground stations: [{ name, latitude deg, longitude deg, altitude km, minimumElevation deg }]",
  } as QuantityInfo,
  days: n("day", "span of the contact search in days (default 7, at most 30)"),
  dataRate: n("bit/s", "downlink data rate"),
  passesPerDay: n("1/day", "passes per day over the station(s), mean over the span"),
  passesPerDayMin: n("1/day", "fewest passes in one day of the span"),
  passesPerDayMax: n("1/day", "most passes in one day of the span"),
  contactPerDay: n("s", "contact time per day, mean over the span"),
  contactPerDayMin: n("s", "contact time of the day with the least contact"),
  longestPass: n("s", "longest pass"),
  shortestPass: n("s", "shortest pass (passes cut by the span's ends left out)"),
  longestGap: n("s", "longest time without contact within the span"),
  dataVolumePerDay: n("Gbit", "data brought down per day: mean daily contact time × data rate"),
  dataVolumePerDayMin: n("Gbit", "data brought down on the day with the least contact"),
  frequency: n("GHz", "carrier frequency"),
  transmitPower: n("W", "transmitter output power"),
  transmitGain: n("dBi", "transmit antenna gain"),
  receiveGain: n("dBi", "receive antenna gain"),
  transmitDiameter: n("m", "transmit dish diameter (gain from diameter and efficiency)"),
  receiveDiameter: n("m", "receive dish diameter (gain from diameter and efficiency)"),
  antennaEfficiency: n(DIMENSIONLESS, "aperture efficiency of the dishes (default 0.55)"),
  gOverT: n("dB/K", "receiving system figure of merit G/T"),
  systemNoiseTemperature: n("K", "receiving system noise temperature"),
  losses: n("dB", "other losses in total: line, pointing, atmospheric, polarisation"),
  requiredEbN0: n("dB", "Eb/N0 the modulation and coding need"),
  range: n("km", "distance from transmitter to receiver"),
  eirp: n("dBW", "effective isotropic radiated power"),
  pathLoss: n("dB", "free-space path loss"),
  cOverN0: n("dB-Hz", "received carrier-to-noise-density ratio"),
  ebN0: n("dB", "received energy per bit over noise density"),
  revolutionsPerCycle: n(DIMENSIONLESS, "revolutions in one repeat cycle"),
  daysPerCycle: n("day", "nodal days in one repeat cycle"),
  nodalPeriod: n("s", "time between ascending node crossings"),
  trackSpacing: n("km", "distance between adjacent tracks at the equator"),
  revolutionsPerDay: n("rev/day", "revolutions per nodal day"),
  // Budgets, lifetime and disposal
  mass: n("kg", "spacecraft mass"),
  dragArea: n("m²", "mean cross-section area facing the flow"),
  dragCoefficient: n(DIMENSIONLESS, "drag coefficient Cd (2.2 is common practice for a compact spacecraft)"),
  ballisticCoefficient: n("kg/m²", "ballistic coefficient m/(Cd·A)"),
  solarActivity: { unit: "", type: "text", description: "solar activity level: low, mean or high" } as QuantityInfo,
  lifetimeYears: n("years", "time until the perigee falls below 100 km"),
  naturalLifetimeYears: n("years", "lifetime without a disposal burn"),
  reentered: { unit: "", type: "boolean", description: "the orbit decays within the integration horizon" } as QuantityInfo,
  decayProfile: { unit: "", type: "table", description: "about 50 samples { years, periapsisAltitude, apoapsisAltitude } for a plot" } as QuantityInfo,
  targetPerigeeAltitude: n("km", "perigee altitude after the disposal burn"),
  deadlineYears: n("years", "disposal deadline after the end of the mission"),
  deadlineMet: { unit: "", type: "boolean", description: "the lifetime is within the deadline" } as QuantityInfo,
  items: { unit: "kg", type: "massItems", description: "list of { name, mass (kg), maturity: new, modified or offTheShelf }" } as QuantityInfo,
  systemMargin: n(DIMENSIONLESS, "system margin as a fraction of the dry mass with growth allowances"),
  launchAllowance: n("kg", "mass the launch allows"),
  basicMass: n("kg", "sum of the items' masses"),
  growthAllowance: n("kg", "sum of the items' growth allowances"),
  massWithGrowth: n("kg", "dry mass including growth allowances"),
  systemMarginMass: n("kg", "system margin"),
  totalWithMargin: n("kg", "dry mass with growth allowances and system margin"),
  wetMass: n("kg", "total with margin plus propellant"),
  allowanceMargin: n(DIMENSIONLESS, "(launch allowance − wet mass) / launch allowance"),
  systemMarginAvailable: n(DIMENSIONLESS, "system margin the launch allowance leaves over the dry mass with growth"),
  fits: { unit: "", type: "boolean", description: "the wet mass is within the launch allowance" } as QuantityInfo,
  massItems: { unit: "", type: "table", description: "each item with its growth allowance" } as QuantityInfo,
  phases: { unit: "km/s", type: "phases", description: "Δv budget phases with their type, margin and manoeuvres" } as QuantityInfo,
  thrusterSpecificImpulse: n("s", "specific impulse of the thrusters"),
  residualFraction: n(DIMENSIONLESS, "residual and reserve propellant as a fraction of the loaded propellant"),
  lossFactor: n(DIMENSIONLESS, "the proposer's stated Δv loss for finite burns or low thrust, as a fraction"),
  deltaVWithMargins: n("km/s", "sum of the phases' Δv with their margins"),
  phaseDeltaV: { unit: "km/s", type: "table", description: "Δv with margin per phase" } as QuantityInfo,
  phaseDeltaVAvailable: {
    unit: "km/s",
    type: "table",
    description: "Δv the usable propellant left at the start of each phase can still give (main engine)",
  } as QuantityInfo,
  phasePropellant: { unit: "kg", type: "table", description: "propellant per phase" } as QuantityInfo,
  propellantRequired: n("kg", "propellant the phases need with their margins"),
  propellantLoaded: n("kg", "initial mass − final mass"),
  propellantUsable: n("kg", "loaded propellant less the residual fraction"),
  propellantRemaining: n("kg", "usable − required propellant"),
  closes: { unit: "", type: "boolean", description: "the usable propellant covers every phase with its margin" } as QuantityInfo,
  closesWithoutStatisticalMargins: {
    unit: "",
    type: "boolean",
    description: "the budget closes when the statistical phases' margins are left out",
  } as QuantityInfo,
} satisfies Record<string, QuantityInfo>;

export type QuantityName = keyof typeof QUANTITIES;

/** Quantities whose unit in one kind differs from the table (the contract fixes these names). */
const KIND_QUANTITIES: Record<string, Record<string, QuantityInfo>> = {
  linkBudget: { margin: n("dB", "received Eb/N0 minus the required Eb/N0") },
};

/** The quantity as one kind uses it (the table entry unless the kind overrides it). */
export function quantityInfoFor(kind: string, name: string): QuantityInfo | undefined {
  const own = Object.prototype.hasOwnProperty.call(KIND_QUANTITIES, kind) ? KIND_QUANTITIES[kind] : undefined;
  if (own && Object.prototype.hasOwnProperty.call(own, name)) return own[name];
  return quantityInfo(name);
}

export function quantityInfo(name: string): QuantityInfo | undefined {
  return Object.prototype.hasOwnProperty.call(QUANTITIES, name) ? (QUANTITIES as Record<string, QuantityInfo>)[name] : undefined;
}

/** Default absolute tolerances per unit (contract version 2 defaults, plus 1e-4 for dimensionless values). */
export const DEFAULT_ABSOLUTE_TOLERANCE: Readonly<Record<string, number>> = {
  km: 1,
  "km/s": 0.001,
  deg: 0.05,
  s: 1,
  kg: 0.1,
  "deg/day": 0.001,
  [DIMENSIONLESS]: 1e-4,
  dB: 0.05,
  dBW: 0.05,
  "dB-Hz": 0.05,
  years: 0.01,
};

/** Contract version 2: 0.1 %. */
export const DEFAULT_RELATIVE_TOLERANCE = 0.001;
