import { z } from "zod";

const degrees = (what: string, min: number, max: number, hint: string) =>
  z
    .number({ message: `${what} must be a number of degrees` })
    .refine(Number.isFinite, `${what} must be a number of degrees, such as 64.8 or 64.8° N`)
    .refine((v) => v >= min && v <= max, hint);

const stationFields = {
  name: z.string().trim().min(1, "give the station a name").max(80, "keep the name under 80 characters"),
  latitude: degrees("Latitude", -90, 90, "latitude must lie between −90° (south) and 90° (north)"),
  longitude: degrees("Longitude", -180, 180, "longitude must lie between −180° (west) and 180° (east)"),
  altitude: z
    .number({ message: "altitude must be a number of km" })
    .refine((v) => Number.isFinite(v) && v >= -0.5 && v <= 10, "height must be between −500 m and 10 km, such as 210 m or 0.21 km"),
  minimumElevation: z
    .number({ message: "minimum elevation must be a number of degrees" })
    .refine((v) => Number.isFinite(v) && v >= 0 && v < 90, "minimum elevation must be a number of degrees, at least 0° and below 90°"),
};

/** A ground station as the API takes it (deg, km; altitude defaults to 0). */
export const stationInput = z.object({ ...stationFields, altitude: stationFields.altitude.default(0) });
export type StationInput = z.infer<typeof stationInput>;

/**
 * An angle as people write it: "64.8", "64.8°", "64.8 N", "147.7° W", "−12.5" (S and W count
 * negative). Returns NaN for anything else.
 */
export function parseAngleText(text: string, negative: "S" | "W"): number {
  const m = /^\s*([+\-−]?)\s*(\d+(?:[.,]\d+)?)\s*°?\s*([NSEWnsew])?\s*$/.exec(text);
  if (!m) return Number.NaN;
  const value = Number(m[2]!.replace(",", "."));
  const sign = m[1] === "-" || m[1] === "−" ? -1 : 1;
  const hemi = m[3]?.toUpperCase();
  if (hemi && hemi !== negative && hemi !== (negative === "S" ? "N" : "E")) return Number.NaN;
  return sign * (hemi === negative ? -1 : 1) * value;
}

/** A station height as people write it: "210 m", "0.21 km", or a bare number of metres. Returns km. */
export function parseHeightText(text: string): number {
  if (text.trim() === "") return 0;
  const m = /^\s*([+\-−]?\d+(?:[.,]\d+)?)\s*(m|km)?\s*$/i.exec(text);
  if (!m) return Number.NaN;
  const value = Number(m[1]!.replace("−", "-").replace(",", "."));
  return m[2]?.toLowerCase() === "km" ? value : value / 1000;
}

const text = z.string().max(40, "keep it short");

/** The chair's form: text fields in the units people write, turned into the station input. */
export const stationFormInput = z
  .object({ name: z.string(), latitude: text, longitude: text, altitude: text.default(""), minimumElevation: text })
  .transform((f) => ({
    name: f.name,
    latitude: parseAngleText(f.latitude, "S"),
    longitude: parseAngleText(f.longitude, "W"),
    altitude: parseHeightText(f.altitude),
    minimumElevation: parseAngleText(f.minimumElevation, "S"),
  }))
  .pipe(z.object(stationFields));
