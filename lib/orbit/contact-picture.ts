/**
 * What the contact pictures draw for a contactTime claim: the passes over each station and
 * their union, the ground track of the first day and each station's visibility circle.
 * Never throws: a claim that cannot be evaluated gives no picture and the reason.
 */
import { resolveBody } from "./bodies";
import { groundTrack, type Interval, type Pass, unionOfPasses } from "./contact";
import { OrbitInputError } from "./errors";
import { Inputs } from "./kinds";
import { contactFromInputs } from "./kinds/contact-time";
import { readContactOrbit, readStations } from "./kinds/coverage-shared";

export interface ContactPicture {
  /** Name of the central body; only the earth gets coastlines. */
  body: string;
  days: number;
  passes: Pass[];
  /** Union of the stations' contact, s from time zero. */
  contact: Interval[];
  /** Sub-satellite points of the first day, every minute (deg). */
  track: { t: number; lat: number; lon: number }[];
  stations: { name: string; latitude: number; longitude: number; minimumElevation: number; coverageRadius: number }[];
}

export function contactPicture(claim: unknown): { picture?: ContactPicture; message?: string } {
  try {
    if (typeof claim !== "object" || claim === null || Array.isArray(claim)) return { message: "not a claim object" };
    const c = claim as Record<string, unknown>;
    if (c.kind !== "contactTime") return { message: "only contactTime claims have a contact picture" };
    const given = typeof c.given === "object" && c.given !== null && !Array.isArray(c.given) ? (c.given as Record<string, unknown>) : {};
    const body = resolveBody(c.body, "earth");
    const g = new Inputs(given, "contactTime");
    const result = contactFromInputs(g, body);
    const orbit = readContactOrbit(g, body);
    const stations = readStations(g).map((s) => {
      // Visibility circle at the mean radius a: λ = arccos((r_s/a) cos ε) − ε (Wertz & Larson, SMAD ch. 5).
      const eps = (s.minimumElevation * Math.PI) / 180;
      const q = ((body.radius + s.altitude) / orbit.a) * Math.cos(eps);
      const lambda = q >= 1 ? 0 : Math.acos(q) - eps;
      return {
        name: s.name,
        latitude: s.latitude,
        longitude: s.longitude,
        minimumElevation: s.minimumElevation,
        coverageRadius: Math.max(0, (lambda * 180) / Math.PI),
      };
    });
    return {
      picture: {
        body: body.name,
        days: result.days,
        passes: result.passes,
        contact: unionOfPasses(result.passes),
        track: groundTrack(body, orbit, 0, 86_400, 60),
        stations,
      },
    };
  } catch (e) {
    return { message: e instanceof OrbitInputError ? e.message : "the claim could not be evaluated" };
  }
}
