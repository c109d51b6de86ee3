/**
 * linkBudget: one radio link with the Friis free-space loss and the usual link equation.
 * Decibels throughout; power in W on input.
 */
import type { Body } from "../constants";
import { fail, fmt } from "../errors";
import { contactGeometry } from "../ground-contact";
import type { Inputs } from "./types";
import { DEG, evaluation, type CoverageKindDef } from "./coverage-shared";

/** Speed of light, m/s (exact, SI definition). */
export const SPEED_OF_LIGHT = 299_792_458;
/** Boltzmann constant, J/K (exact, SI 2019 redefinition); 10·log10(k) = −228.6 dBW/(K·Hz). */
export const BOLTZMANN = 1.380_649e-23;
export const DEFAULT_ANTENNA_EFFICIENCY = 0.55;

const dB = (x: number) => 10 * Math.log10(x);

/** Free-space path loss (Friis transmission equation; ITU-R P.525): L = 20·log10(4π d / λ), d and λ in m. */
export function freeSpaceLoss(rangeKm: number, frequencyGHz: number): number {
  const lambda = SPEED_OF_LIGHT / (frequencyGHz * 1e9);
  return 20 * Math.log10((4 * Math.PI * rangeKm * 1000) / lambda);
}

/** Gain of a circular aperture (parabolic dish): G = η (π D / λ)², in dBi. */
export function dishGain(diameterM: number, frequencyGHz: number, efficiency: number): number {
  const lambda = SPEED_OF_LIGHT / (frequencyGHz * 1e9);
  return dB(efficiency * ((Math.PI * diameterM) / lambda) ** 2);
}

export interface LinkResult {
  eirp: number;
  pathLoss: number;
  cOverN0: number;
  ebN0: number;
  margin: number;
  range: number;
  transmitGain: number;
  gOverT: number;
}

function gainFrom(g: Inputs, gainName: string, diameterName: string, frequency: number, efficiency: number, what: string): number {
  if (g.has(gainName) && g.has(diameterName)) fail(`give ${gainName} (dBi) or ${diameterName} (m) for the ${what} antenna, not both`);
  if (g.has(diameterName)) return dishGain(g.num(diameterName, "positive"), frequency, efficiency);
  if (!g.has(gainName)) fail(`give the ${what} antenna's gain (${gainName}, dBi) or its dish diameter (${diameterName}, m)`);
  const v = g.num(gainName);
  if (!(v > 0)) fail(`given.${gainName} must be a positive gain in dBi (got ${fmt(v)} dBi); an antenna below isotropic is not a link antenna here`);
  return v;
}

export function linkFromInputs(g: Inputs, body: Body): LinkResult {
  const frequency = g.num("frequency", "positive");
  if (frequency > 1000) fail(`given.frequency is in GHz (got ${fmt(frequency)} GHz); divide MHz by 1000`);
  const power = g.num("transmitPower", "positive");
  const efficiency = g.optNum("antennaEfficiency") ?? DEFAULT_ANTENNA_EFFICIENCY;
  if (!(efficiency > 0 && efficiency <= 1)) fail(`given.antennaEfficiency must be a fraction above 0 and at most 1 (got ${fmt(efficiency)})`);
  const gt = gainFrom(g, "transmitGain", "transmitDiameter", frequency, efficiency, "transmit");
  let gOverT: number;
  if (g.has("gOverT")) {
    if (g.has("receiveGain") || g.has("receiveDiameter") || g.has("systemNoiseTemperature"))
      fail("give gOverT (dB/K) alone, or receiveGain (or receiveDiameter) with systemNoiseTemperature, not both");
    gOverT = g.num("gOverT");
  } else {
    const gr = gainFrom(g, "receiveGain", "receiveDiameter", frequency, efficiency, "receive");
    if (!g.has("systemNoiseTemperature")) fail("give systemNoiseTemperature (K) with the receive gain, or gOverT (dB/K) instead");
    // G/T = G − 10·log10(T): Wertz & Larson (eds.), "Space Mission Analysis and Design" (3rd ed.), ch. 13, communications link design (recalled from memory).
    gOverT = gr - dB(g.num("systemNoiseTemperature", "positive"));
  }
  const losses = g.optNum("losses", "nonNegative") ?? 0;
  const dataRate = g.num("dataRate", "positive");
  const required = g.num("requiredEbN0");
  let range: number;
  if (g.has("range")) {
    if (g.has("altitude") || g.has("minimumElevation")) fail("give range (km), or altitude with minimumElevation for the worst-case slant range, not both");
    range = g.num("range", "positive");
  } else {
    if (!g.has("altitude") || !g.has("minimumElevation"))
      fail("give range (km), or altitude (km) and minimumElevation (deg) for the slant range at the lowest elevation");
    const eps = g.num("minimumElevation");
    if (!(eps >= 0 && eps < 90)) fail(`given.minimumElevation must be at least 0° and below 90° (got ${fmt(eps)}°)`);
    const h = g.num("altitude", "positive");
    range = contactGeometry(body.radius, h, eps * DEG).maxSlantRange;
  }
  // EIRP = 10·log10(P) + Gt (dBW): Wertz & Larson (eds.), "Space Mission Analysis and Design" (3rd ed.), ch. 13, communications link design (recalled from memory).
  const eirp = dB(power) + gt;
  const pathLoss = freeSpaceLoss(range, frequency);
  // Link equation C/N0 = EIRP − L_fs − L_other + G/T − 10·log10(k): Wertz & Larson (eds.), "Space Mission Analysis and Design" (3rd ed.), ch. 13, communications link design (recalled from memory).
  const cOverN0 = eirp - pathLoss - losses + gOverT - dB(BOLTZMANN);
  // Eb/N0 = C/N0 − 10·log10(R): Wertz & Larson (eds.), "Space Mission Analysis and Design" (3rd ed.), ch. 13, communications link design (recalled from memory).
  const ebN0 = cOverN0 - dB(dataRate);
  return { eirp, pathLoss, cOverN0, ebN0, margin: ebN0 - required, range, transmitGain: gt, gOverT };
}

export const linkBudgetKind: CoverageKindDef = {
  summary: "EIRP, free-space loss, C/N0, Eb/N0 and margin of a radio link (Friis and the link equation)",
  givenRule:
    "frequency (GHz), transmitPower (W), transmitGain (dBi) or transmitDiameter (m); gOverT (dB/K) or receiveGain (dBi) or receiveDiameter (m) with systemNoiseTemperature (K); optional losses (dB, total) and antennaEfficiency; dataRate (bit/s), requiredEbN0 (dB); range (km) or altitude (km) with minimumElevation (deg)",
  given: [
    ["frequency", "required"],
    ["transmitPower", "required"],
    ["transmitGain", "choice"],
    ["transmitDiameter", "choice"],
    ["receiveGain", "choice"],
    ["receiveDiameter", "choice"],
    ["gOverT", "choice"],
    ["systemNoiseTemperature", "choice"],
    ["antennaEfficiency", "optional"],
    ["losses", "optional"],
    ["dataRate", "required"],
    ["requiredEbN0", "required"],
    ["range", "choice"],
    ["altitude", "choice"],
    ["minimumElevation", "choice"],
  ],
  computed: ["eirp", "pathLoss", "cOverN0", "ebN0", "margin", "range", "transmitGain", "gOverT"],
  evaluate(g, body) {
    const r = linkFromInputs(g, body);
    const messages = r.margin < 0 ? [`the link does not close: the margin is ${fmt(r.margin, 3)} dB`] : [];
    return evaluation({ ...r }, body, { messages });
  },
};
