/**
 * What the orbit-file parsers produce. Plain JSON (stored with the attachment), the same in
 * browser and server. Distances km, speeds km/s, angles degrees, epochs as written plus an
 * ISO form, in the file's own time system.
 */

export type OrbitFileFormat = "tle" | "opm" | "omm" | "oem";
export type OrbitFileEncoding = "tle" | "kvn" | "xml";

/** Frames accepted: the inertial frames these messages commonly use; TEME only for element sets. */
export const ACCEPTED_FRAMES = ["EME2000", "J2000", "GCRF"] as const;
export const ELEMENT_SET_FRAMES = ["TEME"] as const;
export const ACCEPTED_TIME_SYSTEMS = ["UTC", "TAI", "TT"] as const;

export interface Epoch {
  /** As written in the file. */
  text: string;
  /** Calendar form YYYY-MM-DDThh:mm:ss.sss (no zone: it is in `timeSystem`). */
  iso: string;
  /** Milliseconds since 1970-01-01T00:00:00 of the same time scale (no leap seconds). */
  ms: number;
}

export interface StateVector {
  epoch: Epoch;
  /** km */
  r: [number, number, number];
  /** km/s */
  v: [number, number, number];
}

export interface FileHeader {
  version: string;
  creationDate: string | null;
  originator: string | null;
  messageId: string | null;
  comments: string[];
}

export interface OdmMetadata {
  objectName: string;
  objectId: string;
  centerName: string;
  refFrame: string;
  refFrameEpoch: string | null;
  timeSystem: string;
}

/** Lower triangle of the 6×6 position/velocity covariance, row by row (21 values, km², km²/s, km²/s²). */
export interface Covariance {
  refFrame: string | null;
  epoch: string | null;
  lowerTriangle: number[];
}

export interface SpacecraftParameters {
  mass: number | null;
  solarRadArea: number | null;
  solarRadCoeff: number | null;
  dragArea: number | null;
  dragCoeff: number | null;
}

export interface KeplerianElements {
  semiMajorAxis: number;
  eccentricity: number;
  inclination: number;
  raan: number;
  argPericenter: number;
  trueAnomaly: number | null;
  meanAnomaly: number | null;
  gm: number;
}

export interface Maneuver {
  epochIgnition: string;
  duration: number;
  deltaMass: number;
  refFrame: string;
  dv: [number, number, number];
}

export interface OpmFile {
  format: "opm";
  encoding: "kvn" | "xml";
  header: FileHeader;
  metadata: OdmMetadata;
  state: StateVector;
  keplerian: KeplerianElements | null;
  spacecraft: SpacecraftParameters | null;
  covariance: Covariance | null;
  maneuvers: Maneuver[];
}

export interface MeanElements {
  epoch: Epoch;
  /** rev/day, when the file gives MEAN_MOTION. */
  meanMotion: number | null;
  /** km, when the file gives SEMI_MAJOR_AXIS. */
  semiMajorAxis: number | null;
  eccentricity: number;
  inclination: number;
  raan: number;
  argPericenter: number;
  meanAnomaly: number;
  gm: number | null;
}

export interface TleParameters {
  ephemerisType: number | null;
  classificationType: string | null;
  noradCatId: number | null;
  elementSetNo: number | null;
  revAtEpoch: number | null;
  bstar: number | null;
  meanMotionDot: number | null;
  meanMotionDdot: number | null;
}

export interface OmmFile {
  format: "omm";
  encoding: "kvn" | "xml";
  header: FileHeader;
  metadata: OdmMetadata & { meanElementTheory: string };
  meanElements: MeanElements;
  spacecraft: SpacecraftParameters | null;
  tleParameters: TleParameters | null;
  covariance: Covariance | null;
}

export interface OemSegment {
  metadata: OdmMetadata & {
    startTime: string;
    stopTime: string;
    useableStartTime: string | null;
    useableStopTime: string | null;
    interpolation: string | null;
    interpolationDegree: number | null;
  };
  /** How many ephemeris lines the segment holds. */
  stateCount: number;
  first: StateVector;
  last: StateVector;
  /** At most OEM_SAMPLE_STATES states spread evenly over the segment (first and last included). */
  sample: StateVector[];
  /** How many covariance matrices the segment holds. */
  covarianceCount: number;
  /**
   * The segment's covariance matrices, bounded as its states are: the first, the last and at
   * most LIMITS.oemSampleCovariances spread evenly (first and last included). Absent in
   * results stored before covariances were kept.
   */
  covariance?: { first: OemCovariance; last: OemCovariance; sample: OemCovariance[] } | null;
}

/** One covariance matrix of an OEM segment: its epoch, frame (null: the segment's) and lower triangle (21 values, km², km²/s, km²/s²). */
export interface OemCovariance {
  epoch: Epoch;
  refFrame: string | null;
  lowerTriangle: number[];
}

export interface OemFile {
  format: "oem";
  encoding: "kvn" | "xml";
  header: FileHeader;
  segments: OemSegment[];
}

export interface TleSet {
  /** Line number (1-based) of the set's first data line. */
  line: number;
  name: string | null;
  catalogNumber: string;
  classification: string;
  internationalDesignator: string;
  epoch: Epoch;
  /** rev/day */
  meanMotion: number;
  /** rev/day² (first derivative over 2, as written) */
  meanMotionDot: number;
  meanMotionDdot: number;
  bstar: number;
  eccentricity: number;
  inclination: number;
  raan: number;
  argPerigee: number;
  meanAnomaly: number;
  elementSetNumber: number;
  revolutionNumber: number;
  line1: string;
  line2: string;
}

export interface TleFile {
  format: "tle";
  encoding: "tle";
  /** Element sets are mean elements (SGP4) in TEME, epochs in UTC. */
  refFrame: "TEME";
  timeSystem: "UTC";
  sets: TleSet[];
}

export type OrbitFile = TleFile | OpmFile | OmmFile | OemFile;

export interface ParseError {
  /** 1-based line the problem is on, or null when it concerns the whole file. */
  line: number | null;
  message: string;
}

export type ParseOutcome = { ok: true; file: OrbitFile } | { ok: false; error: ParseError };
