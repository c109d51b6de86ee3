/**
 * A call's tolerance for comparing attached orbit files with the dossier's text: one absolute
 * bound per unit (km for altitudes, degrees for inclination, dimensionless for eccentricity,
 * seconds for the period), typed as people write them ("5 km", "500 m", "0.1°", "6 arcmin",
 * "1 min"). Pure: the chair's form, the API and the submission read the same rules.
 * Stored in its own column (calls.file_tolerance), never inside the engine's strict policy.
 */
import { DEFAULT_FILE_TOLERANCE, type FileComparisonTolerance } from "./compare";

export type FileToleranceUnit = keyof FileComparisonTolerance;
export const FILE_TOLERANCE_UNITS = ["km", "deg", "1", "s"] as const satisfies readonly FileToleranceUnit[];

interface UnitRule {
  /** What the bound applies to, for labels and messages. */
  what: string;
  /** Units people may type, with their factor to the stored unit (first one is the stored unit). */
  units: { names: string[]; factor: number }[];
  /** Largest bound accepted: beyond it the comparison checks nothing. */
  max: number;
  example: string;
}

export const FILE_TOLERANCE_RULES: Record<FileToleranceUnit, UnitRule> = {
  km: {
    what: "altitudes",
    units: [
      { names: ["km"], factor: 1 },
      { names: ["m"], factor: 0.001 },
    ],
    max: 500,
    example: "5 km or 500 m",
  },
  deg: {
    what: "inclination",
    units: [
      { names: ["deg", "°", "degrees", "degree"], factor: 1 },
      { names: ["arcmin", "′", "'"], factor: 1 / 60 },
      { names: ["arcsec", "″", '"'], factor: 1 / 3600 },
    ],
    max: 10,
    example: "0.1° or 6 arcmin",
  },
  "1": {
    what: "eccentricity",
    units: [{ names: [""], factor: 1 }],
    max: 0.5,
    example: "0.002",
  },
  s: {
    what: "the period",
    units: [
      { names: ["s", "sec"], factor: 1 },
      { names: ["min"], factor: 60 },
      { names: ["h"], factor: 3600 },
    ],
    max: 86_400,
    example: "60 s or 1 min",
  },
};

const NUMBER = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*)$/;

export type ParsedTolerance = { ok: true; value: number } | { ok: false; message: string };

/** Reads one bound as typed ("5 km", "500 m", "0.1°", "6 arcmin", "1 min"); a bare number is in the stored unit. */
export function parseFileToleranceValue(unit: FileToleranceUnit, input: unknown): ParsedTolerance {
  const rule = FILE_TOLERANCE_RULES[unit];
  const hint = `type a bound for ${rule.what} such as ${rule.example}`;
  let value: number;
  if (typeof input === "number") {
    if (!Number.isFinite(input)) return { ok: false, message: hint };
    value = input;
  } else if (typeof input === "string") {
    const text = input.trim().replace(/(\d)[\s\u00a0\u202f]+(?=\d)/g, "$1");
    if (text === "") return { ok: false, message: `is empty: ${hint}` };
    const m = NUMBER.exec(text);
    if (!m) return { ok: false, message: `"${input.trim().slice(0, 40)}" is not a number with a unit: ${hint} (use a point for decimals)` };
    const written = m[2]!.trim().toLowerCase();
    // A bare number is in the stored unit (the first one).
    const choice = written === "" ? rule.units[0]! : rule.units.find((u) => u.names.includes(written));
    if (!choice) {
      const names = rule.units.flatMap((u) => u.names.filter((n) => n !== "")).join(", ");
      return {
        ok: false,
        message: names
          ? `"${m[2]!.trim().slice(0, 20)}" is not a unit for ${rule.what}: use ${names}`
          : `${rule.what} has no unit: type a plain number such as ${rule.example}`,
      };
    }
    value = Number(m[1]) * choice.factor;
    if (!Number.isFinite(value)) return { ok: false, message: `is too large: ${hint}` };
  } else return { ok: false, message: hint };
  if (value < 0) return { ok: false, message: `cannot be negative: ${hint}` };
  if (value > rule.max) return { ok: false, message: `can be at most ${formatFileToleranceValue(unit, rule.max)}; a wider bound checks nothing` };
  return { ok: true, value };
}

/** The bound as the form shows it ("5 km", "0.1°", "0.002", "60 s"). */
export function formatFileToleranceValue(unit: FileToleranceUnit, value: number): string {
  const v = Number(value.toPrecision(8));
  if (unit === "deg") return `${v}°`;
  if (unit === "1") return String(v);
  return `${v} ${unit}`;
}

/** "altitudes ±5 km, inclination ±0.1°, eccentricity ±0.002, period ±60 s". */
export function fileToleranceSummary(t: FileComparisonTolerance): string {
  return `altitudes ±${formatFileToleranceValue("km", t.km)}, inclination ±${formatFileToleranceValue("deg", t.deg)}, eccentricity ±${formatFileToleranceValue("1", t["1"])}, period ±${formatFileToleranceValue("s", t.s)}`;
}

/** The call's stored setting (null: the defaults) as the bounds the comparison uses. */
export function effectiveFileTolerance(stored: Partial<FileComparisonTolerance> | null | undefined): FileComparisonTolerance {
  return {
    ...DEFAULT_FILE_TOLERANCE,
    ...Object.fromEntries(Object.entries(stored ?? {}).filter(([, v]) => typeof v === "number" && Number.isFinite(v) && v >= 0)),
  };
}

export { DEFAULT_FILE_TOLERANCE };
export type { FileComparisonTolerance };
