/**
 * Ground-station contact geometry for a circular orbit over a spherical body
 * (Wertz & Larson, Space Mission Analysis and Design, ch. 5, spherical Earth geometry).
 * Angles in rad inside.
 */
import { fail, fmt } from "./errors";

export interface ContactGeometry {
  /** Angular radius of the body seen from the satellite, ρ. */
  angularRadius: number;
  /** Nadir angle at minimum elevation, η. */
  nadirAngle: number;
  /** Earth central angle λ from the sub-satellite point to the edge of the coverage circle. */
  earthCentralAngle: number;
  /** Slant range at minimum elevation, km. */
  maxSlantRange: number;
}

export function contactGeometry(radius: number, altitude: number, minimumElevation: number): ContactGeometry {
  if (!(altitude > 0)) fail(`altitude must be above the surface (got ${fmt(altitude)} km)`);
  if (!(minimumElevation >= 0 && minimumElevation < Math.PI / 2)) fail("minimumElevation must be at least 0° and below 90°");
  // sin ρ = R/(R + h).
  const rho = Math.asin(radius / (radius + altitude));
  // sin η = sin ρ·cos ε.
  const eta = Math.asin(Math.sin(rho) * Math.cos(minimumElevation));
  // λ = 90° − ε − η.
  const lambda = Math.PI / 2 - minimumElevation - eta;
  // Law of sines in the station–centre–satellite triangle: D = R sin λ / sin η.
  const D = eta > 0 ? (radius * Math.sin(lambda)) / Math.sin(eta) : altitude;
  return { angularRadius: rho, nadirAngle: eta, earthCentralAngle: lambda, maxSlantRange: D };
}

/** Longest pass (directly overhead), ignoring the body's rotation: T·(2λ)/(2π). */
export function maxPassDuration(periodSeconds: number, earthCentralAngle: number): number {
  // Fraction of the orbit spent inside the coverage circle on an overhead pass.
  return (periodSeconds * 2 * earthCentralAngle) / (2 * Math.PI);
}
