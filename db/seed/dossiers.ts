// The demo dossiers: invented missions of the invented organisations in people.ts, each with
// prose under the calls' required sections and orbit-check blocks built by claims.ts. Figures
// in the prose are the blocks' own (engine) values, so the text and the claims agree — except
// where a dossier is wrong on purpose, and then the text repeats the wrong figure as the
// proposer believed it.
import type { DossierDoc, DossierNode } from "@/lib/dossier/schema";
import {
  blockNode,
  budget,
  budgetWithoutMargin,
  claimed,
  consistent,
  fixed,
  keplerDegreesAsRadians,
  periodFromAltitude,
  planeChangeRadiansAsDegrees,
  rounded,
  ssoForWrongAltitude,
  value,
  type Maneuver,
  type SeedBlock,
} from "./claims";
import { elementSet, ephemerisOem, ledgerCsv, summaryPdf, type SeedFile } from "./files";
import type { PersonKey } from "./people";

/** Required sections of both demo calls (headings of every dossier). */
export const REQUIRED_SECTIONS = ["Mission objectives", "Orbit design", "Propulsion and Δv budget", "Operations and risks"] as const;

export type CallKey = "decided" | "open";

export interface DossierSpec {
  key: string;
  call: CallKey;
  owner: PersonKey;
  title: string;
  missionType: string;
  doc: DossierDoc;
  blocks: SeedBlock[];
  files: () => Promise<SeedFile[]>;
}

type Part = string | { b: string };

function text(parts: Part[]): DossierNode[] {
  return parts
    .filter((x) => (typeof x === "string" ? x.length > 0 : x.b.length > 0))
    .map((x) => (typeof x === "string" ? { type: "text", text: x } : { type: "text", text: x.b, marks: [{ type: "bold" }] }));
}

const h = (title: string): DossierNode => ({ type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: title }] });
const p = (...parts: Part[]): DossierNode => ({ type: "paragraph", content: text(parts) });
const list = (...items: string[]): DossierNode => ({ type: "bulletList", content: items.map((i) => ({ type: "listItem", content: [p(i)] })) });

function doc(sections: Record<(typeof REQUIRED_SECTIONS)[number], (DossierNode | SeedBlock)[]>): DossierDoc {
  const content: DossierNode[] = [];
  for (const heading of REQUIRED_SECTIONS) {
    content.push(h(heading));
    for (const item of sections[heading]) content.push("blockId" in item ? blockNode(item) : item);
  }
  return { type: "doc", content };
}

const km = (n: number) => `${Math.round(n).toLocaleString("en-GB")} km`;
const minutes = (seconds: number) => `${fixed(seconds / 60, 1)} minutes`;
const ms = (kmPerS: number) => `${Math.round(kmPerS * 1000)} m/s`;
const days = (seconds: number) => `${fixed(seconds / 86_400, 1)} days`;
const pct = (fraction: number) => `${Math.round(fraction * 100)} %`;

// ---------------------------------------------------------------------------------------
// Round 7 (decided call)

function tern1(): DossierSpec {
  const orbit = consistent({ label: "the operational orbit", kind: "orbit", body: "earth", given: { altitude: 540 }, claim: { period: 0, orbitType: true } });
  const sso = consistent({
    label: "the sun-synchronous inclination",
    kind: "sunSynchronous",
    body: "earth",
    given: { altitude: 540 },
    claim: { inclination: 2 },
  });
  const eclipse = consistent({
    label: "the longest eclipse",
    kind: "eclipse",
    body: "earth",
    given: { altitude: 540, betaAngle: 0 },
    claim: { eclipseDuration: 0 },
  });
  const pass = consistent({
    label: "a pass over the Halden station",
    kind: "groundContact",
    body: "earth",
    given: { altitude: 540, minimumElevation: 10 },
    claim: { maxPassDuration: 0 },
  });
  const trim = consistent({
    label: "the insertion trim",
    kind: "hohmann",
    body: "earth",
    given: { initialAltitude: 515, finalAltitude: 540 },
    claim: { deltaVTotal: 3 },
  });
  const disposal = consistent({
    label: "the disposal burn",
    kind: "hohmann",
    body: "earth",
    given: { initialAltitude: 540, finalAltitude: 330 },
    claim: { deltaV1: 3 },
  });
  const maneuvers: Maneuver[] = [
    { name: "insertion trim", deltaV: rounded(value(trim, "deltaVTotal"), 3) },
    { name: "drag make-up, 5 years", deltaV: 0.035 },
    { name: "collision avoidance allowance", deltaV: 0.01 },
    { name: "disposal (perigee to 330 km)", deltaV: rounded(value(disposal, "deltaV1"), 3) },
  ];
  const dv = budget({ label: "the Δv budget", maneuvers, specificImpulse: 225, initialMass: 68, margin: 0.18, requiredMargin: 0.1 });
  const blocks = [orbit, sso, eclipse, pass, trim, disposal, dv];
  return {
    key: "tern-1",
    call: "decided",
    owner: "nadia",
    title: "Tern-1 Coastal Water Imager",
    missionType: "earth-observation",
    blocks,
    doc: doc({
      "Mission objectives": [
        p(
          "Tern-1 maps turbidity and chlorophyll along the fjord coasts of the northern seaboard every two days, at 18 m ground sampling in six visible and near-infrared bands. The data feed the regional aquaculture monitoring service run by Corvid Orbital Works' partners.",
        ),
        p("The satellite is a 68 kg smallsat with a pushbroom imager, a green monopropellant thruster and an S-band downlink."),
      ],
      "Orbit design": [
        p(
          `The operational orbit is circular at 540 km, a ${minutes(claimed(orbit, "period"))} period that repeats the ground track every two days. It is sun-synchronous at `,
          { b: `${fixed(claimed(sso, "inclination"), 2)}°` },
          " inclination with a 10:30 descending node, so the illumination of the coast stays the same through the year.",
        ),
        orbit,
        sso,
        p(
          `The longest eclipse lasts ${minutes(claimed(eclipse, "eclipseDuration"))} (beta angle 0°), which sizes the battery; a pass over the Halden station above 10° elevation lasts up to ${minutes(claimed(pass, "maxPassDuration"))}.`,
        ),
        eclipse,
        pass,
      ],
      "Propulsion and Δv budget": [
        p(
          `The rideshare releases Tern-1 at 515 km; a trim of ${ms(claimed(trim, "deltaVTotal"))} raises it to 540 km. At the end of the mission a ${ms(claimed(disposal, "deltaV1"))} burn lowers the perigee to 330 km so the satellite re-enters well within the 25-year guideline.`,
        ),
        trim,
        disposal,
        p(
          `With a specific impulse of 225 s and 68 kg at separation, the tanks provide ${ms(claimed(dv, "deltaVAvailable"))} against ${ms(claimed(dv, "deltaVRequired"))} required: a margin of ${pct(claimed(dv, "margin"))}.`,
        ),
        dv,
      ],
      "Operations and risks": [
        p("Operations run from the Halden ground station with a second station at Corvid's facility for contingency passes. Commissioning takes six weeks."),
        list(
          "Imager focus shift after launch: covered by an on-board focus mechanism tested in thermal vacuum.",
          "Thruster qualification: the green monopropellant thruster flew on two earlier missions of the same supplier.",
          "Conjunctions: the collision-avoidance allowance covers four manoeuvres over five years.",
        ),
      ],
    }),
    files: async () => [
      await summaryPdf("tern-1-concept-summary.pdf", "Tern-1 Coastal Water Imager", "Corvid Orbital Works", [
        `Orbit: circular 540 km, sun-synchronous, inclination ${fixed(claimed(sso, "inclination"), 2)} deg, period ${minutes(claimed(orbit, "period"))}.`,
        `Delta-v: ${ms(claimed(dv, "deltaVRequired"))} required, ${ms(claimed(dv, "deltaVAvailable"))} available (margin ${pct(claimed(dv, "margin"))}).`,
        "Payload: six-band pushbroom imager, 18 m ground sampling, 2-day revisit of the northern coast.",
      ]),
      ledgerCsv("tern-1-delta-v-ledger.csv", maneuvers, "specific impulse 225 s, 68 kg at separation"),
      elementSet("tern-1-planned.tle", "TERN-1 (PLANNED)", {
        semiMajorAxis: value(orbit, "semiMajorAxis"),
        eccentricity: 0.0001,
        inclination: value(sso, "inclination"),
        raan: 112.5,
        argPeriapsis: 90,
        meanAnomaly: 0,
      }),
    ],
  };
}

/** Skiff-EP, version 1 (the propellant was sized without the margin) or version 2 (sized with 12 %). */
export function skiffEp(version: 1 | 2 = 1): DossierSpec {
  const gto = consistent({
    label: "the rideshare transfer orbit",
    kind: "orbit",
    body: "earth",
    given: { periapsisAltitude: 250, apoapsisAltitude: 35786 },
    claim: { period: 0, apoapsisSpeed: 3 },
  });
  const raise = consistent({
    label: "the impulsive equivalent of the raise",
    kind: "hohmann",
    body: "earth",
    given: { initialAltitude: 250, finalAltitude: 35786 },
    claim: { deltaV2: 3, transferTime: 0 },
  });
  const reorbit = consistent({
    label: "the end-of-life re-orbit",
    kind: "hohmann",
    body: "earth",
    given: { initialAltitude: 35786, finalAltitude: 36086 },
    claim: { deltaVTotal: 3 },
  });
  const lowThrustFactor = 1.35;
  const maneuvers: Maneuver[] = [
    { name: "orbit raising to GEO (low thrust, 1.35 x impulsive)", deltaV: rounded(value(raise, "deltaV2") * lowThrustFactor, 3) },
    { name: "station acquisition and drift stop", deltaV: 0.015 },
    { name: "re-orbit 300 km above GEO", deltaV: rounded(value(reorbit, "deltaVTotal"), 3) },
  ];
  const dv =
    version === 1
      ? budgetWithoutMargin({ label: "the xenon budget", maneuvers, specificImpulse: 1450, initialMass: 180, claimedMargin: 0.1, requiredMargin: 0.1 })
      : budget({ label: "the xenon budget", maneuvers, specificImpulse: 1450, initialMass: 180, margin: 0.12, requiredMargin: 0.1 });
  const finalMass = dv.claim.given.finalMass as number;
  const xenon = consistent({
    label: "the xenon load",
    kind: "rocket",
    given: { specificImpulse: 1450, initialMass: 180, finalMass },
    claim: { propellantMass: 1 },
  });
  const blocks = [gto, raise, reorbit, dv, xenon];
  const required = maneuvers.reduce((s, m) => s + m.deltaV, 0);
  const budgetProse =
    version === 1
      ? p(
          `The Hall thruster (specific impulse 1450 s) carries ${fixed(claimed(xenon, "propellantMass"), 1)} kg of xenon for ${ms(required)} of manoeuvres, `,
          { b: "which includes the 10 % margin the call asks for" },
          ".",
        )
      : p(
          `Version 2 resizes the tank: ${fixed(claimed(xenon, "propellantMass"), 1)} kg of xenon give ${ms(claimed(dv, "deltaVAvailable"))} against ${ms(required)} required, a margin of ${pct(claimed(dv, "margin"))} above the call's 10 %.`,
        );
  return {
    key: "skiff-ep",
    call: "decided",
    owner: "tobias",
    title: "Skiff-EP Rideshare Orbit Raiser",
    missionType: "technology-demonstration",
    blocks,
    doc: doc({
      "Mission objectives": [
        p(
          "Skiff-EP demonstrates that a 180 kg hosted-payload carrier can ride a geostationary transfer rideshare and raise itself to GEO with its own electric propulsion, freeing small operators from the price of a dedicated GEO launch.",
        ),
        p("The demonstration payload is a Ka-band beacon for propagation experiments with three university ground stations."),
      ],
      "Orbit design": [
        p(
          `The rideshare leaves Skiff-EP in a 250 × 35 786 km transfer orbit with a period of ${minutes(claimed(gto, "period"))}. At apogee it moves at ${fixed(claimed(gto, "apoapsisSpeed"), 3)} km/s; geostationary speed is higher, and the thruster makes up the difference over about five months.`,
        ),
        gto,
        p(
          `The impulsive equivalent of the raise is the apogee burn of the transfer, ${ms(claimed(raise, "deltaV2"))}; we budget ${lowThrustFactor}× that figure for the losses of a low-thrust spiral (common practice for a first estimate).`,
        ),
        raise,
      ],
      "Propulsion and Δv budget": [
        budgetProse,
        dv,
        xenon,
        p(`At the end of the mission Skiff-EP re-orbits 300 km above GEO for ${ms(claimed(reorbit, "deltaVTotal"))}.`),
        reorbit,
      ],
      "Operations and risks": [
        p(
          "The raise runs autonomously between weekly ground contacts; the thruster fires around apogee and the attitude system keeps the arrays on the sun otherwise.",
        ),
        list(
          "Radiation dose through the belts during the five-month raise: the avionics are rated for 30 krad behind 3 mm aluminium.",
          "Thruster lifetime: the raise needs 2 900 hours of the 8 000 hours qualified.",
          "Slot coordination: the beacon's GEO slot is filed through the operator's own authority.",
        ),
      ],
    }),
    files: async () => [
      await summaryPdf("skiff-ep-concept-summary.pdf", "Skiff-EP Rideshare Orbit Raiser", "Lumen Fjord Space", [
        "Rideshare to a 250 x 35786 km transfer orbit, electric-propulsion raise to GEO in about five months.",
        `Xenon: ${fixed(claimed(xenon, "propellantMass"), 1)} kg at a specific impulse of 1450 s for ${ms(required)} of manoeuvres.`,
      ]),
      ledgerCsv("skiff-ep-delta-v-ledger.csv", maneuvers, version === 1 ? "tank sized for the total" : "tank sized for the total plus 12 %"),
    ],
  };
}

function wisp(): DossierSpec {
  const transfer = consistent({
    label: "the Earth–Mars transfer",
    kind: "interplanetaryHohmann",
    body: "sun",
    given: { from: "earth", to: "mars", departureAltitude: 300 },
    claim: { transferTime: -3, departureExcessSpeed: 3 },
  });
  const vInf = rounded(value(transfer, "departureExcessSpeed"), 3);
  const escape = consistent({
    label: "the departure hyperbola",
    kind: "escape",
    body: "earth",
    given: { parkingAltitude: 300, hyperbolicExcessSpeed: vInf },
    claim: { c3: 2, deltaV: 3 },
  });
  const correction = planeChangeRadiansAsDegrees({ label: "the flyby plane correction", body: "sun", angle: 2, speed: vInf });
  const thruster = consistent({
    label: "the cubesat's propulsion",
    kind: "rocket",
    given: { specificImpulse: 220, initialMass: 14, finalMass: 13.6 },
    claim: { deltaV: 3 },
  });
  const blocks = [transfer, escape, correction, thruster];
  return {
    key: "wisp",
    call: "decided",
    owner: "maren",
    title: "Wisp Mars Flyby CubeSat",
    missionType: "planetary",
    blocks,
    doc: doc({
      "Mission objectives": [
        p(
          "Wisp is a 12U cubesat that flies past Mars and images the night side in the thermal infrared during the closest approach, as a pathfinder for student-built deep-space missions at Sorrel University.",
        ),
      ],
      "Orbit design": [
        p(
          `Wisp is released from the upper stage of a Mars-bound primary mission on its departure hyperbola. The minimum-energy transfer takes ${days(claimed(transfer, "transferTime"))} and leaves Earth with a hyperbolic excess speed of ${fixed(claimed(transfer, "departureExcessSpeed"), 3)} km/s (C3 ${fixed(claimed(escape, "c3"), 2)} km²/s²).`,
        ),
        transfer,
        escape,
        p(
          `Our flyby geometry needs the arrival plane turned by 2°. `,
          { b: `At ${fixed(vInf, 3)} km/s this plane correction costs only ${fixed(claimed(correction, "deltaV") * 1000, 1)} m/s` },
          ", well inside the cubesat's capability.",
        ),
        correction,
      ],
      "Propulsion and Δv budget": [
        p(
          `A green monopropellant module (specific impulse 220 s) takes the cubesat from 14 kg to 13.6 kg for ${ms(claimed(thruster, "deltaV"))} of corrections.`,
        ),
        thruster,
      ],
      "Operations and risks": [
        p(
          "Tracking uses the primary mission's deep-space network time, two passes a week during cruise. The flyby images are stored and downlinked over the following month.",
        ),
        list("The cubesat's X-band radio has not flown beyond lunar distance.", "Thermal design for cruise is based on analysis only."),
      ],
    }),
    files: async () => [
      await summaryPdf("wisp-concept-summary.pdf", "Wisp Mars Flyby CubeSat", "Sorrel University CubeSat Team", [
        `Transfer: ${days(claimed(transfer, "transferTime"))}, departure excess speed ${fixed(vInf, 3)} km/s.`,
        `Propulsion: ${ms(claimed(thruster, "deltaV"))} from a 0.4 kg green monopropellant load.`,
      ]),
    ],
  };
}

// ---------------------------------------------------------------------------------------
// Round 8 (open call)

function lantern(): DossierSpec {
  const parking = consistent({ label: "the parking orbit", kind: "orbit", body: "earth", given: { altitude: 200 }, claim: { period: 0 } });
  const tli = consistent({
    label: "the translunar transfer",
    kind: "hohmann",
    body: "earth",
    given: { initialAltitude: 200, finalRadius: 384_400 },
    initialFrom: parking.blockId,
    claim: { deltaV1: 3, transferTime: 0 },
  });
  const lunar = consistent({
    label: "the lunar science orbit",
    kind: "orbit",
    body: "moon",
    given: { altitude: 100 },
    claim: { period: 0, periapsisSpeed: 3 },
  });
  const loi = consistent({
    label: "lunar orbit insertion",
    kind: "escape",
    body: "moon",
    given: { parkingAltitude: 100, hyperbolicExcessSpeed: 0.8 },
    claim: { deltaV: 3 },
  });
  const maneuvers: Maneuver[] = [
    { name: "trajectory corrections", deltaV: 0.03 },
    { name: "lunar orbit insertion", deltaV: rounded(value(loi, "deltaV"), 3) },
    { name: "orbit maintenance, 12 months", deltaV: 0.06 },
  ];
  const dv = budget({ label: "the Δv budget", maneuvers, specificImpulse: 230, initialMass: 240, margin: 0.14, requiredMargin: 0.1 });
  return {
    key: "lantern",
    call: "open",
    owner: "ayla",
    title: "Lantern Lunar Pathfinder",
    missionType: "lunar",
    blocks: [parking, tli, lunar, loi, dv],
    doc: doc({
      "Mission objectives": [
        p(
          "Lantern maps hydrogen in the permanently shadowed craters near the lunar south pole with a collimated neutron spectrometer, at 100 km altitude, for twelve months.",
        ),
        p("It also carries a laser retroreflector for the ranging stations of three partner observatories."),
      ],
      "Orbit design": [
        p(
          `The launcher leaves Lantern in a 200 km parking orbit (period ${minutes(claimed(parking, "period"))}). The translunar injection of ${ms(claimed(tli, "deltaV1"))} is done by the launcher's upper stage; the coast to lunar distance takes ${days(claimed(tli, "transferTime"))}.`,
        ),
        parking,
        tli,
        p(
          `At the Moon, Lantern circles at 100 km in ${minutes(claimed(lunar, "period"))} at ${fixed(claimed(lunar, "periapsisSpeed"), 3)} km/s. Arriving with 0.8 km/s of excess speed, the insertion burn is ${ms(claimed(loi, "deltaV"))}.`,
        ),
        lunar,
        loi,
      ],
      "Propulsion and Δv budget": [
        p(
          `A bipropellant module with a specific impulse of 230 s gives ${ms(claimed(dv, "deltaVAvailable"))} against ${ms(claimed(dv, "deltaVRequired"))} required, a margin of ${pct(claimed(dv, "margin"))}.`,
        ),
        dv,
      ],
      "Operations and risks": [
        p("Greywing Lunar Systems operates Lantern from its control centre with leased deep-space antenna time, three passes a day during the science phase."),
        list(
          "Orbit maintenance at 100 km depends on the lunar gravity field; the 60 m/s allowance covers twelve months with weekly trims.",
          "The spectrometer's collimator has flight heritage from an earlier orbiter.",
        ),
      ],
    }),
    files: async () => [
      await summaryPdf("lantern-concept-summary.pdf", "Lantern Lunar Pathfinder", "Greywing Lunar Systems", [
        `Lunar orbit: circular 100 km, period ${minutes(claimed(lunar, "period"))}.`,
        `Delta-v: ${ms(claimed(dv, "deltaVRequired"))} required, margin ${pct(claimed(dv, "margin"))}.`,
      ]),
      ledgerCsv("lantern-delta-v-ledger.csv", maneuvers, "specific impulse 230 s, 240 kg wet"),
    ],
  };
}

function aurora(): DossierSpec {
  const science = consistent({
    label: "the science orbit",
    kind: "orbit",
    body: "earth",
    given: { periapsisAltitude: 600, apoapsisAltitude: 38_000 },
    claim: { period: 0, eccentricity: 4, apoapsisSpeed: 3 },
  });
  const outbound = consistent({
    label: "the outbound leg",
    kind: "timeOfFlight",
    body: "earth",
    given: { periapsisAltitude: 600, apoapsisAltitude: 38_000, trueAnomalyFrom: 0, trueAnomalyTo: 180 },
    claim: { time: 0 },
  });
  const e = rounded(value(science, "eccentricity"), 4);
  const meanAnomaly = rounded((360 * 3600) / value(science, "period"), 2);
  const position = keplerDegreesAsRadians({ label: "one hour after periapsis", eccentricity: e, meanAnomaly });
  const drift = consistent({
    label: "the apsidal drift",
    kind: "j2Rates",
    body: "earth",
    given: { periapsisAltitude: 600, apoapsisAltitude: 38_000, inclination: 63.4 },
    claim: { argPeriapsisRate: 4, raanRate: 3 },
  });
  return {
    key: "aurora",
    call: "open",
    owner: "lise",
    title: "Aurora Tandem Magnetosphere Probes",
    missionType: "science",
    blocks: [science, outbound, position, drift],
    doc: doc({
      "Mission objectives": [
        p(
          "Two identical 45 kg probes fly the same eccentric orbit half an orbit apart and measure the magnetic field and energetic particles of the outer radiation belt on every pass, separating changes in time from changes in space.",
        ),
      ],
      "Orbit design": [
        p(
          `The science orbit runs from 600 km to 38 000 km (eccentricity ${fixed(claimed(science, "eccentricity"), 4)}), with a period of ${minutes(claimed(science, "period"))}. Each probe spends ${minutes(claimed(outbound, "time"))} climbing from periapsis to apoapsis, where it slows to ${fixed(claimed(science, "apoapsisSpeed"), 3)} km/s.`,
        ),
        science,
        outbound,
        p(
          `For the instrument timeline we need the position one hour after periapsis: a mean anomaly of ${fixed(meanAnomaly, 2)}°, `,
          { b: `which gives a true anomaly of ${fixed(claimed(position, "trueAnomaly"), 1)}°` },
          ".",
        ),
        position,
        p(
          `At 63.4° inclination the line of apsides stays put (${fixed(claimed(drift, "argPeriapsisRate"), 4)}°/day), while the node drifts ${fixed(claimed(drift, "raanRate"), 3)}°/day.`,
        ),
        drift,
      ],
      "Propulsion and Δv budget": [
        p(
          "The probes carry cold-gas thrusters for attitude only; the launcher delivers each probe into the science orbit, and no orbit manoeuvres are planned.",
        ),
      ],
      "Operations and risks": [
        p("Perihelion Instruments operates both probes with a single 3.7 m antenna; each probe is contacted once per orbit near apoapsis."),
        list(
          "Radiation: the probes cross the belts twice per orbit; parts are screened to 100 krad.",
          "Probe separation drifts by launch dispersion; the science case holds for separations of 30 to 70 % of an orbit.",
        ),
      ],
    }),
    files: async () => [
      await summaryPdf("aurora-concept-summary.pdf", "Aurora Tandem Magnetosphere Probes", "Perihelion Instruments", [
        `Orbit: 600 x 38000 km, inclination 63.4 deg, period ${minutes(claimed(science, "period"))}.`,
      ]),
      ephemerisOem("aurora-a-predicted.oem", "AURORA-A", "PERIHELION INSTRUMENTS", {
        semiMajorAxis: value(science, "semiMajorAxis"),
        eccentricity: value(science, "eccentricity"),
        inclination: 63.4,
        raan: 40,
        argPeriapsis: 270,
        trueAnomaly: 0,
      }),
    ],
  };
}

function harrow(): DossierSpec {
  const orbit = consistent({ label: "the radar orbit", kind: "orbit", body: "earth", given: { altitude: 800 }, claim: { period: 0 } });
  const sso = ssoForWrongAltitude({ label: "the sun-synchronous inclination", altitude: 800, designAltitude: 500 });
  const eclipse = consistent({
    label: "the dawn-dusk eclipse season",
    kind: "eclipse",
    body: "earth",
    given: { altitude: 800, betaAngle: 60 },
    claim: { eclipseDuration: 0 },
  });
  const pass = consistent({
    label: "a polar station pass",
    kind: "groundContact",
    body: "earth",
    given: { altitude: 800, minimumElevation: 5 },
    claim: { maxPassDuration: 0 },
  });
  const disposal = consistent({
    label: "the disposal burn",
    kind: "hohmann",
    body: "earth",
    given: { initialAltitude: 800, finalAltitude: 350 },
    claim: { deltaV1: 3 },
  });
  const maneuvers: Maneuver[] = [
    { name: "orbit acquisition", deltaV: 0.02 },
    { name: "ground-track maintenance, 7 years", deltaV: 0.025 },
    { name: "disposal (perigee to 350 km)", deltaV: rounded(value(disposal, "deltaV1"), 3) },
  ];
  const dv = budget({ label: "the Δv budget", maneuvers, specificImpulse: 220, initialMass: 410, margin: 0.2, requiredMargin: 0.1 });
  // Ground coverage: the cooperative's two polar stations (on the board's station list), the
  // 4-day repeat the ground-track maintenance keeps, and the X-band downlink at the 5° mask.
  // The inclination as the dossier states it (the flagged 500 km figure): the proposer used it throughout.
  const inclination = claimed(sso, "inclination");
  const stations = HARROW_STATIONS.map((name) => stationValues(name));
  const contact = consistent({
    label: "daily contact at the cooperative's stations",
    kind: "contactTime",
    body: "earth",
    given: { altitude: 800, inclination, stations, dataRate: 150e6 },
    claim: { passesPerDay: 1, contactPerDayMin: 0, longestGap: 0, dataVolumePerDay: 0 },
  });
  const repeat = consistent({
    label: "the 4-day repeating ground track",
    kind: "repeatGroundTrack",
    body: "earth",
    given: { revolutionsPerCycle: 57, daysPerCycle: 4, inclination, eccentricity: 0 },
    claim: { altitude: 0, trackSpacing: 0 },
  });
  const link = {
    ...consistent({
      label: "the X-band downlink",
      kind: "linkBudget",
      body: "earth",
      given: {
        frequency: 8.2,
        transmitPower: 10,
        transmitGain: 10,
        gOverT: 24,
        losses: 4.5,
        dataRate: 150e6,
        requiredEbN0: 4.4,
        altitude: 800,
        minimumElevation: stationValues("Tarnholm polar site").minimumElevation,
      },
      claim: { eirp: 1, pathLoss: 1, margin: 1 },
    }),
    written: { given: { minimumElevation: { text: "5", unit: "deg", station: "Tarnholm polar site" } } },
  };
  return {
    key: "harrow",
    call: "open",
    owner: "kofi",
    title: "Harrow Sea-Ice Radar Satellite",
    missionType: "earth-observation",
    blocks: [orbit, sso, eclipse, pass, disposal, dv, contact, repeat, link],
    doc: doc({
      "Mission objectives": [
        p(
          "Harrow measures sea-ice thickness and drift across the Arctic with an L-band synthetic-aperture radar, every three days through the polar night, for the shipping-route service of the Meridian Polar Systems Cooperative.",
        ),
      ],
      "Orbit design": [
        p(
          `The radar needs a higher orbit than our first concept: the baseline is now circular at 800 km (period ${minutes(claimed(orbit, "period"))}), dawn-dusk and sun-synchronous at `,
          { b: `${fixed(claimed(sso, "inclination"), 2)}° inclination` },
          ".",
        ),
        orbit,
        sso,
        p(
          `In the dawn-dusk orbit the satellite is in sunlight most of the year; in the eclipse season (beta angle 60°) the longest shadow lasts ${minutes(claimed(eclipse, "eclipseDuration"))}. Passes over the polar station above 5° elevation last up to ${minutes(claimed(pass, "maxPassDuration"))}.`,
        ),
        eclipse,
        pass,
      ],
      "Propulsion and Δv budget": [
        p(
          `The hydrazine system (specific impulse 220 s, 410 kg wet) provides ${ms(claimed(dv, "deltaVAvailable"))} against ${ms(claimed(dv, "deltaVRequired"))} required, including a ${ms(claimed(disposal, "deltaV1"))} disposal burn.`,
        ),
        disposal,
        dv,
      ],
      "Operations and risks": [
        p(
          `The ground track repeats after 57 revolutions in 4 days at ${km(claimed(repeat, "altitude"))}, with adjacent tracks ${km(claimed(repeat, "trackSpacing"))} apart at the equator; acquisition trims the 800 km baseline to it and the ground-track maintenance keeps it.`,
        ),
        repeat,
        p(
          `The cooperative's two polar stations, Tarnholm and Vesterhaug, see Harrow on about ${fixed(claimed(contact, "passesPerDay"), 1)} passes a day; `,
          { b: `even the day with the least contact has ${fixed(claimed(contact, "contactPerDayMin") / 60, 0)} minutes` },
          `, and at 150 Mbit/s that brings down about ${fixed(claimed(contact, "dataVolumePerDay"), 0)} Gbit a day. The longest silence is ${fixed(claimed(contact, "longestGap") / 3600, 1)} hours.`,
        ),
        contact,
        p(
          `The X-band downlink (10 W into a 10 dBi antenna, 150 Mbit/s, stations with G/T 24 dB/K) is sized at Tarnholm's 5° mask, where the range is longest: it closes with ${fixed(claimed(link, "margin"), 1)} dB.`,
        ),
        link,
        list(
          "The deployable radar antenna is the main mechanical risk; a qualification model passed deployment tests at −40 °C.",
          "Frequency coordination for L-band radar is handled with the national authority.",
        ),
      ],
    }),
    files: async () => [
      await summaryPdf("harrow-concept-summary.pdf", "Harrow Sea-Ice Radar Satellite", "Meridian Polar Systems Cooperative", [
        `Orbit: circular 800 km, dawn-dusk, period ${minutes(claimed(orbit, "period"))}.`,
        "Payload: L-band SAR, 3-day Arctic coverage.",
      ]),
      ledgerCsv("harrow-delta-v-ledger.csv", maneuvers, "specific impulse 220 s, 410 kg wet"),
    ],
  };
}

function quill(): DossierSpec {
  const orbit = periodFromAltitude({ label: "the deployment orbit", body: "earth", altitude: 420 });
  const pass = consistent({
    label: "a pass over the campus station",
    kind: "groundContact",
    body: "earth",
    given: { altitude: 420, minimumElevation: 10 },
    claim: { maxPassDuration: 0, maxSlantRange: 0 },
  });
  const eclipse = consistent({
    label: "the longest eclipse",
    kind: "eclipse",
    body: "earth",
    given: { altitude: 420, betaAngle: 0 },
    claim: { eclipseDuration: 0 },
  });
  return {
    key: "quill",
    call: "open",
    owner: "maren",
    title: "Quill Student Beacon CubeSat",
    missionType: "technology-demonstration",
    blocks: [orbit, pass, eclipse],
    doc: doc({
      "Mission objectives": [
        p(
          "Quill is a 1U cubesat built by students to test a low-power UHF beacon and a student-designed sun sensor, and to train the next team in operations.",
        ),
      ],
      "Orbit design": [
        p(
          "Quill is deployed from the space station into a circular orbit at 420 km. ",
          { b: `Kepler's third law gives one orbit every ${fixed(claimed(orbit, "period"), 1)} s` },
          ", so the beacon schedule is set per orbit.",
        ),
        orbit,
        p(
          `A pass over the campus station above 10° elevation lasts up to ${minutes(claimed(pass, "maxPassDuration"))} at ranges up to ${km(claimed(pass, "maxSlantRange"))}; the longest eclipse is ${minutes(claimed(eclipse, "eclipseDuration"))}.`,
        ),
        pass,
        eclipse,
      ],
      "Propulsion and Δv budget": [p("Quill has no propulsion. Drag brings it down within about two years, well within the 25-year guideline.")],
      "Operations and risks": [
        p("The campus station listens on every pass; radio amateurs are invited to report beacon receptions."),
        list("The sun sensor is a first design.", "Battery capacity is sized for the longest eclipse with 30 % margin."),
      ],
    }),
    files: async () => [
      await summaryPdf("quill-concept-summary.pdf", "Quill Student Beacon CubeSat", "Sorrel University CubeSat Team", [
        "1U cubesat, deployed at 420 km, UHF beacon and sun sensor experiment.",
      ]),
    ],
  };
}

function petrel(): DossierSpec {
  const transfer = consistent({
    label: "the transfer to GEO",
    kind: "hohmann",
    body: "earth",
    given: { initialAltitude: 300, finalAltitude: 35_786 },
    claim: { deltaV1: 3, deltaV2: 3, deltaVTotal: 3, transferTime: 0 },
  });
  const gto = consistent({
    label: "the transfer orbit",
    kind: "orbit",
    body: "earth",
    given: { periapsisAltitude: 300, apoapsisAltitude: 35_786 },
    claim: { apoapsisSpeed: 3 },
  });
  const geo = consistent({
    label: "the geostationary orbit",
    kind: "orbit",
    body: "earth",
    given: { altitude: 35_786 },
    claim: { period: 0, periapsisSpeed: 3 },
  });
  const combined = consistent({
    label: "the combined apogee burn",
    kind: "planeChange",
    body: "earth",
    given: { angle: 28.5, initialSpeed: rounded(value(gto, "apoapsisSpeed"), 3), finalSpeed: rounded(value(geo, "periapsisSpeed"), 3) },
    claim: { deltaV: 3 },
  });
  const maneuvers: Maneuver[] = [
    { name: "perigee burn", deltaV: rounded(value(transfer, "deltaV1"), 3) },
    { name: "apogee burn with 28.5 deg plane change", deltaV: rounded(value(combined, "deltaV"), 3) },
    { name: "station keeping, 2 years", deltaV: 0.1 },
  ];
  const dv = budget({ label: "the stage budget", maneuvers, specificImpulse: 320, initialMass: 1450, margin: 0.08, requiredMargin: 0.05 });
  return {
    key: "petrel",
    call: "open",
    owner: "tobias",
    title: "Petrel GEO Hosted-Payload Transfer Stage",
    missionType: "communications",
    blocks: [transfer, gto, geo, combined, dv],
    doc: doc({
      "Mission objectives": [
        p(
          "Petrel is a storable-bipropellant transfer stage that takes three hosted communication payloads from a 300 km low-inclination parking orbit to GEO and stays with them as a common bus for two years.",
        ),
      ],
      "Orbit design": [
        p(
          `A coplanar Hohmann transfer would need ${ms(claimed(transfer, "deltaV1"))} at perigee and ${ms(claimed(transfer, "deltaV2"))} at apogee (${ms(claimed(transfer, "deltaVTotal"))} in total) and takes ${minutes(claimed(transfer, "transferTime"))}.`,
        ),
        transfer,
        gto,
        geo,
        p(
          `The parking orbit is inclined 28.5°; the stage removes the inclination in the apogee burn, turning ${fixed(claimed(gto, "apoapsisSpeed"), 3)} km/s into the geostationary ${fixed(claimed(geo, "periapsisSpeed"), 3)} km/s, for ${ms(claimed(combined, "deltaV"))}.`,
        ),
        combined,
      ],
      "Propulsion and Δv budget": [
        p(
          `With 1 450 kg wet and a specific impulse of 320 s the stage has ${ms(claimed(dv, "deltaVAvailable"))} for ${ms(claimed(dv, "deltaVRequired"))}, a margin of ${pct(claimed(dv, "margin"))}.`,
        ),
        dv,
      ],
      "Operations and risks": [
        p("Lumen Fjord Space operates the stage; each payload owner operates its own payload through the stage's shared downlink."),
        list(
          "Main engine restart after the coast: four restarts qualified.",
          "Hosted payload interface: a common power and data interface is defined in the attached specification.",
        ),
      ],
    }),
    files: async () => [
      await summaryPdf("petrel-concept-summary.pdf", "Petrel GEO Hosted-Payload Transfer Stage", "Lumen Fjord Space", [
        `Delta-v: ${ms(claimed(dv, "deltaVRequired"))} required, margin ${pct(claimed(dv, "margin"))}.`,
      ]),
      ledgerCsv("petrel-delta-v-ledger.csv", maneuvers, "specific impulse 320 s, 1450 kg wet"),
    ],
  };
}

function kite(): DossierSpec {
  const orbit = consistent({ label: "the operational orbit", kind: "orbit", body: "earth", given: { altitude: 600 }, claim: { period: 0 } });
  const sso = consistent({
    label: "the sun-synchronous inclination",
    kind: "sunSynchronous",
    body: "earth",
    given: { altitude: 600 },
    claim: { inclination: 2 },
  });
  const dropOff = consistent({ label: "the rideshare drop-off orbit", kind: "orbit", body: "earth", given: { altitude: 480 }, claim: { period: 0 } });
  const raise = consistent({
    label: "the raise to the operational orbit",
    kind: "hohmann",
    body: "earth",
    given: { initialAltitude: 480, finalAltitude: 600 },
    initialFrom: dropOff.blockId,
    claim: { deltaVTotal: 3, transferTime: 0 },
  });
  const disposal = consistent({
    label: "the disposal burn",
    kind: "hohmann",
    body: "earth",
    given: { initialAltitude: 600, finalAltitude: 330 },
    claim: { deltaV1: 3 },
  });
  const maneuvers: Maneuver[] = [
    { name: "raise from the drop-off orbit", deltaV: rounded(value(raise, "deltaVTotal"), 3) },
    { name: "drag make-up, 7 years", deltaV: 0.05 },
    { name: "disposal (perigee to 330 km)", deltaV: rounded(value(disposal, "deltaV1"), 3) },
  ];
  const dv = budget({ label: "the Δv budget", maneuvers, specificImpulse: 225, initialMass: 74, margin: 0.15, requiredMargin: 0.1 });
  return {
    key: "kite",
    call: "open",
    owner: "nadia",
    title: "Kite Ocean-Colour Pair",
    missionType: "earth-observation",
    blocks: [orbit, sso, dropOff, raise, disposal, dv],
    doc: doc({
      "Mission objectives": [
        p("Kite follows Tern-1 with two satellites half an orbit apart, halving the revisit time of the coastal water products to one day."),
      ],
      "Orbit design": [
        p(`Both satellites fly at 600 km (period ${minutes(claimed(orbit, "period"))}), sun-synchronous at ${fixed(claimed(sso, "inclination"), 2)}°.`),
        orbit,
        sso,
        p(
          `The only rideshare with a suitable node leaves its passengers at 480 km (period ${minutes(claimed(dropOff, "period"))}). Each satellite raises itself to 600 km with two burns, ${ms(claimed(raise, "deltaVTotal"))} in ${minutes(claimed(raise, "transferTime"))}; the second waits half an orbit before its first burn.`,
        ),
        dropOff,
        raise,
      ],
      "Propulsion and Δv budget": [
        p(
          `Draft: the green monopropellant system of Tern-1 (specific impulse 225 s) with 74 kg at separation gives ${ms(claimed(dv, "deltaVAvailable"))} against ${ms(claimed(dv, "deltaVRequired"))}, including a ${ms(claimed(disposal, "deltaV1"))} disposal burn.`,
        ),
        disposal,
        dv,
      ],
      "Operations and risks": [p("Draft: operations reuse the Tern-1 ground segment.")],
    }),
    files: async () => [],
  };
}

function sable(): DossierSpec {
  const orbit = consistent({
    label: "the prospecting orbit",
    kind: "orbit",
    body: "moon",
    given: { periapsisAltitude: 30, apoapsisAltitude: 120 },
    claim: { period: 0, periapsisSpeed: 3 },
  });
  const descent = consistent({
    label: "the lowering from the arrival orbit",
    kind: "hohmann",
    body: "moon",
    given: { initialAltitude: 120, finalAltitude: 30 },
    claim: { deltaV1: 3 },
  });
  const capture = consistent({
    label: "lunar capture",
    kind: "escape",
    body: "moon",
    given: { parkingAltitude: 120, hyperbolicExcessSpeed: 0.75 },
    claim: { deltaV: 3 },
  });
  const maneuvers: Maneuver[] = [
    { name: "lunar capture", deltaV: rounded(value(capture, "deltaV"), 3) },
    { name: "periapsis lowering to 30 km", deltaV: rounded(value(descent, "deltaV1"), 3) },
    { name: "orbit maintenance, 6 months", deltaV: 0.09 },
  ];
  const dv = budgetWithoutMargin({ label: "the Δv budget", maneuvers, specificImpulse: 225, initialMass: 310, claimedMargin: 0.15, requiredMargin: 0.1 });
  return {
    key: "sable",
    call: "open",
    owner: "ayla",
    title: "Sable Lunar Ice Prospector",
    missionType: "lunar",
    blocks: [orbit, capture, descent, dv],
    doc: doc({
      "Mission objectives": [
        p(
          "Sable images the floors of polar craters from a low periapsis with an active infrared illuminator, to confirm where the neutron data of earlier missions point to water ice.",
        ),
      ],
      "Orbit design": [
        p(
          `Sable is captured into a 120 km orbit (${ms(claimed(capture, "deltaV"))} from 0.75 km/s of excess speed) and then lowers its periapsis to 30 km over the south pole for ${ms(claimed(descent, "deltaV1"))}. The 30 × 120 km orbit has a period of ${minutes(claimed(orbit, "period"))}; at periapsis Sable passes at ${fixed(claimed(orbit, "periapsisSpeed"), 3)} km/s.`,
        ),
        capture,
        descent,
        orbit,
      ],
      "Propulsion and Δv budget": [
        p(
          `The monopropellant system (specific impulse 225 s, 310 kg wet) covers ${ms(claimed(dv, "deltaVRequired"))} of manoeuvres, `,
          { b: `with the ${pct(claimed(dv, "margin"))} margin required by our own rules` },
          ".",
        ),
        dv,
      ],
      "Operations and risks": [
        p("Greywing operates Sable together with Lantern from the same control centre."),
        list(
          "A 30 km periapsis leaves little room for errors in the lunar gravity model; maintenance burns are weekly.",
          "The illuminator draws 180 W for 4 minutes per pass.",
        ),
      ],
    }),
    files: async () => [
      await summaryPdf("sable-concept-summary.pdf", "Sable Lunar Ice Prospector", "Greywing Lunar Systems", [
        `Orbit: 30 x 120 km lunar polar, period ${minutes(claimed(orbit, "period"))}.`,
      ]),
      ledgerCsv("sable-delta-v-ledger.csv", maneuvers, "specific impulse 225 s, 310 kg wet"),
    ],
  };
}

function glint(): DossierSpec {
  const orbit = consistent({ label: "the inspection orbit", kind: "orbit", body: "earth", given: { altitude: 750 }, claim: { period: 0 } });
  const hop = consistent({
    label: "the hop to the target",
    kind: "hohmann",
    body: "earth",
    given: { initialAltitude: 750, finalAltitude: 790 },
    initialFrom: orbit.blockId,
    claim: { deltaVTotal: 3, transferTime: 0 },
  });
  const tilt = consistent({ label: "the plane match", kind: "planeChange", body: "earth", given: { angle: 0.4, altitude: 790 }, claim: { deltaV: 3 } });
  const tank = consistent({
    label: "the tug's propulsion",
    kind: "rocket",
    given: { specificImpulse: 210, initialMass: 95, finalMass: 82 },
    claim: { deltaV: 3 },
  });
  return {
    key: "glint",
    call: "open",
    owner: "kofi",
    title: "Glint Debris Inspection Tug",
    missionType: "technology-demonstration",
    blocks: [orbit, hop, tilt, tank],
    doc: doc({
      "Mission objectives": [
        p(
          "Glint approaches a derelict upper stage of our own cooperative to within 50 m and images it from all sides, as the first step towards a removal service.",
        ),
      ],
      "Orbit design": [
        p(
          `From the 750 km inspection orbit (${minutes(claimed(orbit, "period"))}) Glint hops 40 km up to the target for ${ms(claimed(hop, "deltaVTotal"))} and matches its plane, 0.4° away, for ${ms(claimed(tilt, "deltaV"))}.`,
        ),
        orbit,
        hop,
        tilt,
      ],
      "Propulsion and Δv budget": [p(`Draft: the tug's ${ms(claimed(tank, "deltaV"))} must also cover the approach and hold points.`), tank],
      "Operations and risks": [p("Draft: close approach only with the chair's safety review.")],
    }),
    files: async () => [],
  };
}

function vesper(): DossierSpec {
  const departure = consistent({
    label: "the departure from the parking orbit",
    kind: "escape",
    body: "earth",
    given: { parkingAltitude: 500, c3: 0.6 },
    claim: { deltaV: 3, hyperbolicExcessSpeed: 3 },
  });
  const soi = consistent({ label: "Earth's sphere of influence", kind: "sphereOfInfluence", body: "earth", given: {}, claim: { radius: -3 } });
  const hyperbola = consistent({
    label: "the escape hyperbola",
    kind: "orbit",
    body: "earth",
    given: { periapsisAltitude: 500, eccentricity: 1.0087 },
    claim: { orbitType: true, hyperbolicExcessSpeed: 3 },
  });
  return {
    key: "vesper",
    call: "open",
    owner: "lise",
    title: "Vesper Heliophysics Escape CubeSat",
    missionType: "science",
    blocks: [departure, soi, hyperbola],
    doc: doc({
      "Mission objectives": [
        p(
          "Vesper carries a compact solar-wind analyser beyond Earth's influence, trailing the Earth in its orbit, to measure the wind upstream of the magnetosphere's flanks.",
        ),
      ],
      "Orbit design": [
        p(
          `From a 500 km parking orbit the kick stage adds ${ms(claimed(departure, "deltaV"))} for a C3 of 0.6 km²/s² (excess speed ${fixed(claimed(departure, "hyperbolicExcessSpeed"), 3)} km/s). Vesper leaves Earth's sphere of influence, about ${km(claimed(soi, "radius"))} away, after roughly three weeks.`,
        ),
        departure,
        soi,
        hyperbola,
      ],
      "Propulsion and Δv budget": [p("The kick stage is supplied by the rideshare provider; Vesper itself carries no propulsion.")],
      "Operations and risks": [
        p("Perihelion Instruments tracks Vesper with its own antenna until it drifts beyond range after about 14 months."),
        list("Communication range limits the mission length.", "The kick stage is a new product of the rideshare provider."),
      ],
    }),
    files: async () => [
      await summaryPdf("vesper-concept-summary.pdf", "Vesper Heliophysics Escape CubeSat", "Perihelion Instruments", [
        "6U cubesat, escape with C3 0.6 km2/s2, solar-wind analyser.",
      ]),
    ],
  };
}

// ---------------------------------------------------------------------------------------
// Round 8: two dossiers judged against the call's requirements (budgets and disposal)

/** No propulsion: natural decay from 720 km takes decades, beyond the call's 25 years. */
function plover(): DossierSpec {
  // 6U: 11.2 kg, 0.06 m² mean cross-section, Cd 2.2 (the usual value for a compact body).
  const drag = { mass: 11.2, dragArea: 0.06, dragCoefficient: 2.2 };
  const orbit = consistent({ label: "the survey orbit", kind: "orbit", body: "earth", given: { altitude: 720 }, claim: { period: 0 } });
  const eclipse = consistent({
    label: "the longest eclipse",
    kind: "eclipse",
    body: "earth",
    given: { altitude: 720, betaAngle: 0 },
    claim: { eclipseDuration: 0 },
  });
  const disposal = consistent({
    label: "end of life by natural decay",
    kind: "disposal",
    body: "earth",
    given: { altitude: 720, ...drag, solarActivity: "mean", deadlineYears: 25 },
    claim: { lifetimeYears: 1, deltaV: 3, deadlineMet: true },
  });
  return {
    key: "plover",
    call: "open",
    owner: "kofi",
    title: "Plover Sea-Ice Radar Altimeter",
    missionType: "earth-observation",
    blocks: [orbit, eclipse, disposal],
    doc: doc({
      "Mission objectives": [p("Plover measures sea-ice freeboard in the Barents Sea with a compact Ka-band radar altimeter for two winters.")],
      "Orbit design": [
        p(
          `A 720 km circular orbit (period ${minutes(claimed(orbit, "period"))}) keeps the altimeter footprint small; the longest eclipse lasts ${minutes(claimed(eclipse, "eclipseDuration"))}.`,
        ),
        orbit,
        eclipse,
      ],
      "Propulsion and Δv budget": [p("Plover carries no propulsion: the 6U bus has no room for a thruster next to the radar.")],
      "Operations and risks": [
        p(
          `Without a thruster Plover leaves its orbit by drag alone. With a ballistic coefficient of ${fixed(value(disposal, "ballisticCoefficient"), 0)} kg/m² and mean solar activity, `,
          { b: `re-entry takes about ${fixed(claimed(disposal, "lifetimeYears"), 0)} years` },
          ".",
        ),
        disposal,
        list("A drag sail was considered and left out for mass.", "Solar maximum in the second winter would shorten the decay."),
      ],
    }),
    files: async () => [
      await summaryPdf("plover-concept-summary.pdf", "Plover Sea-Ice Radar Altimeter", "Meridian Polar Systems Cooperative", [
        "6U cubesat, 720 km circular orbit, no propulsion.",
      ]),
    ],
  };
}

/** Phased budget whose tank holds the deterministic phases with margin but not the statistical margin. */
function curlew(): DossierSpec {
  const m0 = 152;
  const isp = 220;
  const phases = [
    {
      name: "orbit raising",
      type: "deterministic",
      margin: 0.1,
      maneuvers: [
        { name: "raise apogee", deltaV: 0.061 },
        { name: "circularise", deltaV: 0.06 },
      ],
    },
    { name: "station keeping, 4 years", type: "deterministic", margin: 0.1, maneuvers: [{ name: "drag make-up", deltaV: 0.028 }] },
    {
      name: "dispersion corrections",
      type: "statistical",
      margin: 0.2,
      maneuvers: [
        { name: "insertion dispersion", deltaV: 0.035 },
        { name: "collision avoidance", deltaV: 0.012, engine: "thrusters" },
      ],
    },
    { name: "disposal", type: "deterministic", margin: 0.1, maneuvers: [{ name: "perigee to 250 km", deltaV: 0.128 }] },
  ];
  const base = { specificImpulse: isp, thrusterSpecificImpulse: 200, initialMass: m0, residualFraction: 0.03 };
  // Propellant the engine asks for with every margin, and with the statistical margin left out.
  const full = value(consistent({ label: "sizing", kind: "deltaVBudget", given: { ...base, finalMass: 1, phases }, claim: {} }), "propellantRequired");
  const lean = value(
    consistent({
      label: "sizing",
      kind: "deltaVBudget",
      given: { ...base, finalMass: 1, phases: phases.map((ph) => (ph.type === "statistical" ? { ...ph, margin: 0 } : ph)) },
      claim: {},
    }),
    "propellantRequired",
  );
  // The tank was sized for the lean figure (plus the residual): the budget closes only without the statistical margin.
  const finalMass = rounded(m0 - (lean * 1.005) / (1 - base.residualFraction), 1);
  const loaded = m0 - finalMass;
  if (!(loaded * (1 - base.residualFraction) > lean && loaded * (1 - base.residualFraction) < full))
    throw new Error("curlew's tank is not between the two budgets");
  const dv = consistent({
    label: "the phased Δv budget",
    kind: "deltaVBudget",
    given: { ...base, finalMass, phases },
    claim: { deltaVRequired: 3, deltaVWithMargins: 3, propellantRequired: 1, closes: true, closesWithoutStatisticalMargins: true },
  });
  const mass = consistent({
    label: "the mass budget",
    kind: "massBudget",
    given: {
      items: [
        { name: "structure and harness", mass: 21.5, maturity: "new" },
        { name: "propulsion module (dry)", mass: 14.2, maturity: "modified" },
        { name: "avionics and radio", mass: 9.8, maturity: "offTheShelf" },
        { name: "power", mass: 17.4, maturity: "modified" },
        { name: "hyperspectral imager", mass: 31, maturity: "new" },
      ],
      systemMargin: 0.2,
      launchAllowance: 160,
      propellantMass: rounded(loaded, 1),
    },
    claim: { totalWithMargin: 1, wetMass: 1, fits: true },
  });
  return {
    key: "curlew",
    call: "open",
    owner: "lise",
    title: "Curlew Hyperspectral Coastal Imager",
    missionType: "earth-observation",
    blocks: [dv, mass],
    doc: doc({
      "Mission objectives": [p("Curlew maps algal blooms along temperate coasts with a hyperspectral imager, revisiting each site every three days.")],
      "Orbit design": [
        p("Curlew is released at 480 km and raises itself to a 560 km circular orbit, where it stays for four years before lowering its perigee."),
      ],
      "Propulsion and Δv budget": [
        p(
          `The budget is phased: deterministic phases carry 10 % and the dispersion corrections 20 %. With every margin the phases need ${fixed(value(dv, "propellantRequired"), 2)} kg of propellant; `,
          { b: `the tank holds ${fixed(loaded, 1)} kg, of which ${fixed(value(dv, "propellantUsable"), 2)} kg are usable` },
          ".",
        ),
        dv,
        mass,
      ],
      "Operations and risks": [p("The tank is the largest the bus takes; a larger one would need a new structure.")],
    }),
    files: async () => [
      await summaryPdf("curlew-concept-summary.pdf", "Curlew Hyperspectral Coastal Imager", "Perihelion Instruments", [
        "Phased Δv budget with 10 % (deterministic) and 20 % (statistical) margins.",
      ]),
    ],
  };
}

// ---------------------------------------------------------------------------------------
// The board's ground stations (invented sites), kept by the chair under "Ground stations"

export const DEMO_STATIONS = [
  { name: "Tarnholm polar site", latitude: 70.4, longitude: 22.6, altitude: 0.08, minimumElevation: 5 },
  { name: "Vesterhaug station", latitude: 62.3, longitude: -7.0, altitude: 0.12, minimumElevation: 5 },
  { name: "Sorrel campus dish", latitude: 47.6, longitude: 9.9, altitude: 0.52, minimumElevation: 10 },
] as const;

const HARROW_STATIONS = ["Tarnholm polar site", "Vesterhaug station"] as const;

/** A station's values as a contact claim copies them from the board's list. */
function stationValues(name: string) {
  const s = DEMO_STATIONS.find((x) => x.name === name);
  if (!s) throw new Error(`no demo station ${name}`);
  return { ...s };
}

/** Every demo dossier, version 1. */
export function demoDossiers(): DossierSpec[] {
  return [tern1(), skiffEp(1), wisp(), lantern(), aurora(), harrow(), quill(), petrel(), kite(), sable(), glint(), vesper(), plover(), curlew()];
}

/** The requirements the open call sets (added before any dossier is submitted). */
export const OPEN_CALL_REQUIREMENTS = [
  {
    type: "deltaVMargin",
    params: { deterministicMargin: 0.1, statisticalMargin: 0.2 },
    rationale: "Round 8 budgets carry 10 % on planned manoeuvres and 20 % on corrections sized from dispersions, and must close with them.",
  },
  { type: "systemMassMargin", params: { minimumMargin: 0.2 }, rationale: "" },
  { type: "disposalDeadline", params: { years: 25 }, rationale: "" },
  { type: "maxEclipse", params: { maximumDuration: 40 * 60 }, rationale: "The board's reference battery is sized for 40 minutes of shadow per orbit." },
  {
    type: "minDailyContact",
    params: { minimumPerDay: 90 * 60, stations: [...HARROW_STATIONS] },
    rationale: "The cooperative's sea-ice service needs every day's radar data on the ground the same day.",
  },
  { type: "minLinkMargin", params: { minimumMargin: 3 }, rationale: "A 3 dB link margin is common practice for screening, not the rule of any authority." },
] as const;
