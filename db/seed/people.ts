// The rest of the demo board's invented cast: reviewers and proposers at invented
// organisations, addresses under the reserved example domains. Two relationships are on
// purpose: Runa Halvorsen declares a conflict with one proposal, and Jonas Aberle shares
// an e-mail domain with a proposer from another part of the same university (a likely
// conflict the chair is warned about). Listed in the README (section "Demo accounts").
import type { BoardRole } from "@/db/schema";
import { DEMO_ACCOUNTS, type SeedPerson } from "./accounts";

/** One password for the whole cast beyond the four role accounts (demo only). */
export const DEMO_CAST_PASSWORD = "kestrel-cast-demo";

export type PersonKey = "chair" | "teodor" | "ines" | "piet" | "runa" | "jonas" | "nadia" | "tobias" | "maren" | "ayla" | "kofi" | "lise";

export interface DemoPerson extends SeedPerson {
  key: PersonKey;
  role: BoardRole;
}

function account(key: "chair" | "reviewer" | "proposer"): SeedPerson {
  const a = DEMO_ACCOUNTS.find((x) => x.key === key);
  if (!a) throw new Error(`demo account ${key} is missing`);
  return a;
}

const cast = (key: PersonKey, role: BoardRole, name: string, email: string, organisation: string): DemoPerson => ({
  key,
  role,
  name,
  email,
  organisation,
  password: DEMO_CAST_PASSWORD,
  isAdmin: false,
});

export const DEMO_PEOPLE: readonly DemoPerson[] = [
  { ...account("chair"), key: "chair", role: "chair" },
  { ...account("reviewer"), key: "teodor", role: "reviewer" },
  cast("ines", "reviewer", "Ines Marchetti", "ines.marchetti@vellum-astro.example.com", "Vellum Astrodynamics"),
  cast("piet", "reviewer", "Piet Okonkwo-Lange", "piet.okonkwo-lange@brightwater-geodesy.example.org", "Brightwater Geodesy Centre"),
  cast("runa", "reviewer", "Runa Halvorsen", "runa.halvorsen@tarn-propulsion.example.net", "Tarn Propulsion Laboratory"),
  cast("jonas", "reviewer", "Jonas Aberle", "jonas.aberle@sorrel-uni.example.org", "Sorrel University, Department of Aerospace Engineering"),
  { ...account("proposer"), key: "nadia", role: "proposer" },
  cast("tobias", "proposer", "Tobias Rennick", "tobias.rennick@lumenfjord.example.com", "Lumen Fjord Space"),
  cast("maren", "proposer", "Maren Oduya", "maren.oduya@sorrel-uni.example.org", "Sorrel University CubeSat Team"),
  cast("ayla", "proposer", "Ayla Brandvik", "ayla.brandvik@greywing-lunar.example.net", "Greywing Lunar Systems"),
  cast("kofi", "proposer", "Kofi Asante-Berg", "kofi.asante-berg@meridian-polar.example.org", "Meridian Polar Systems Cooperative"),
  cast("lise", "proposer", "Lise Tamura", "lise.tamura@perihelion-instruments.example.com", "Perihelion Instruments"),
];
