/**
 * Earth's upper-atmosphere density for drag decay: a piecewise exponential model.
 *
 * Source of the table: the exponential atmospheric model of Vallado, "Fundamentals of
 * Astrodynamics and Applications" (Table 7-4 in the 2nd/3rd editions, 8-4 in the 4th),
 * built from the U.S. Standard Atmosphere 1976 at 0 km and CIRA-72 above 25 km (with an
 * exospheric temperature of 1000 K above 500 km). Values recalled from memory; each row is
 * base altitude (km), nominal density at the base (kg/m³) and scale height (km).
 *
 * Solar activity: `mean` is the table itself. `low` and `high` multiply every scale height
 * above 120 km by 0.9 and 1.15 (a hotter thermosphere is more extended). This is a
 * common-practice screening approximation, not a published table: it gives density ratios
 * high/low of about 8 at 400 km and about 35 at 800 km, the size of the swing over a
 * solar cycle.
 */
import { fail, fmt } from "./errors";

export type SolarActivity = "low" | "mean" | "high";
export const SOLAR_ACTIVITIES: readonly SolarActivity[] = ["low", "mean", "high"];

/** [base altitude km, density at base kg/m³, scale height km] (Vallado's exponential model). */
export const EXPONENTIAL_ATMOSPHERE: readonly (readonly [number, number, number])[] = [
  [0, 1.225, 7.249],
  [25, 3.899e-2, 6.349],
  [30, 1.774e-2, 6.682],
  [40, 3.972e-3, 7.554],
  [50, 1.057e-3, 8.382],
  [60, 3.206e-4, 7.714],
  [70, 8.77e-5, 6.549],
  [80, 1.905e-5, 5.799],
  [90, 3.396e-6, 5.382],
  [100, 5.297e-7, 5.877],
  [110, 9.661e-8, 7.263],
  [120, 2.438e-8, 9.473],
  [130, 8.484e-9, 12.636],
  [140, 3.845e-9, 16.149],
  [150, 2.07e-9, 22.523],
  [180, 5.464e-10, 29.74],
  [200, 2.789e-10, 37.105],
  [250, 7.248e-11, 45.546],
  [300, 2.418e-11, 53.628],
  [350, 9.518e-12, 53.298],
  [400, 3.725e-12, 58.515],
  [450, 1.585e-12, 60.828],
  [500, 6.967e-13, 63.822],
  [600, 1.454e-13, 71.835],
  [700, 3.614e-14, 88.667],
  [800, 1.17e-14, 124.64],
  [900, 5.245e-15, 181.05],
  [1000, 3.019e-15, 268],
];

/** Scale-height factor above 120 km per solar activity level (common practice, see above). */
export const SOLAR_SCALE_HEIGHT_FACTOR: Readonly<Record<SolarActivity, number>> = { low: 0.9, mean: 1, high: 1.15 };

const PIVOT_KM = 120;
const RHO_PIVOT = 2.438e-8;

function rowIndex(h: number): number {
  let lo = 0;
  let hi = EXPONENTIAL_ATMOSPHERE.length - 1;
  // Last row whose base altitude is at or below h (binary search).
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (EXPONENTIAL_ATMOSPHERE[mid]![0] <= h) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** Scale height of the tabulated model at altitude h km (km), scaled for the solar activity above 120 km. */
export function scaleHeight(h: number, activity: SolarActivity = "mean"): number {
  const H = EXPONENTIAL_ATMOSPHERE[rowIndex(Math.max(0, h))]![2];
  return h > PIVOT_KM ? H * SOLAR_SCALE_HEIGHT_FACTOR[activity] : H;
}

/** Density of the tabulated (mean) model at altitude h km, kg/m³. */
export function tabulatedDensity(h: number): number {
  if (!Number.isFinite(h)) fail(`altitude ${fmt(h)} km is not a number`);
  if (h < 0) h = 0;
  const [h0, rho0, H] = EXPONENTIAL_ATMOSPHERE[rowIndex(h)]!;
  // Exponential model ρ = ρ0·exp(−(h − h0)/H) (Vallado, exponential atmosphere).
  return rho0 * Math.exp(-(h - h0) / H);
}

/**
 * Density at altitude h km for a solar activity level, kg/m³. Above 120 km the scale
 * heights are multiplied by a factor s: ρ(h) = ρ(120)·(ρ_tab(h)/ρ(120))^(1/s).
 */
export function density(h: number, activity: SolarActivity = "mean"): number {
  const rho = tabulatedDensity(h);
  const s = SOLAR_SCALE_HEIGHT_FACTOR[activity];
  if (h <= PIVOT_KM || s === 1) return rho;
  // ln(ρ/ρ120) = −∫dh/H, so scaling every H by s divides the exponent by s.
  return RHO_PIVOT * Math.pow(rho / RHO_PIVOT, 1 / s);
}
