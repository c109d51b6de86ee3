/**
 * Every quantity name the engine knows, with its unit and value type. A name means the
 * same thing, in the same unit, in every kind that uses it.
 */

export type QuantityType = "number" | "vector" | "text" | "boolean" | "body" | "maneuvers";

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
} satisfies Record<string, QuantityInfo>;

export type QuantityName = keyof typeof QUANTITIES;

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
};

/** Contract version 2: 0.1 %. */
export const DEFAULT_RELATIVE_TOLERANCE = 0.001;
