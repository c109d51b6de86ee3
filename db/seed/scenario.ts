// The demo scenario on the invented board: two calls (one decided, one open), twelve
// dossiers, attachments, a rubric, a declared conflict, assignments, reviews with scores,
// review items anchored to the dossiers' text, and the decided call's three decisions with
// their letters. Everything goes through the data-access layer acting as the seeded people,
// so the rules, snapshots, server recompute, outbox mail and PDF letters are the product's
// own. Uploads take the browser's path: a presigned PUT, then the confirmation.
import crypto from "node:crypto";
import { and, eq } from "drizzle-orm";
import type { Database } from "@/db/client";
import { calls } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/session";
import { assignReviewers } from "@/lib/dal/assignments";
import { confirmAttachment, presignAttachmentUpload } from "@/lib/dal/attachments";
import { createCall, updateCall } from "@/lib/dal/calls";
import { addRequirement } from "@/lib/dal/requirements";
import { createStation } from "@/lib/dal/stations";
import { stationInput } from "@/lib/validation/stations";
import { requirementInputSchema } from "@/lib/validation/requirements";
import { declareConflict } from "@/lib/dal/conflicts";
import { createInvitation, revokeInvitation } from "@/lib/dal/invitations";
import { createDecision, getLetterTemplate } from "@/lib/decisions";
import { reassignPreviousReviewers } from "@/lib/review/reassign";
import { createProposal, getDraft, saveDraft, submitProposal } from "@/lib/dal/proposals";
import { createReviewItem, listReviewItems } from "@/lib/dal/review-items";
import { answerReviewItem, recordDisposition, setResponseWindow } from "@/lib/dal/responses";
import { getReviewScreen, saveCheckNote, saveReviewDraft, submitReview } from "@/lib/dal/reviews";
import { saveCallRubric } from "@/lib/dal/rubrics";
import { dossierPlainText, type DossierNode } from "@/lib/dossier";
import { callInputSchema } from "@/lib/validation/dossier";
import type { RubricInput } from "@/lib/validation/review";
import { DEMO_BOARD, ensureBoard, ensurePerson, type SeedBoard } from "./accounts";
import { DEMO_STATIONS, demoDossiers, OPEN_CALL_REQUIREMENTS, REQUIRED_SECTIONS, skiffEp, type CallKey, type DossierSpec } from "./dossiers";
import type { SeedFile } from "./files";
import { DEMO_PEOPLE, type PersonKey } from "./people";

export const DECIDED_CALL_TITLE = "Kestrel Round 7: Earth orbit and rideshare missions";
export const OPEN_CALL_TITLE = "Kestrel Round 8: Lunar, planetary and science orbits";

const DAY = 86_400_000;

export const DEMO_RUBRIC: RubricInput = {
  name: "Kestrel mission rubric",
  criteria: [
    {
      id: "mission-return",
      title: "Mission return",
      description: "What the mission delivers to its users and to the programme.",
      weight: 40,
      scaleMin: 1,
      scaleMax: 5,
      levels: ["Little of value", "Narrow", "Useful", "Strong", "Exceptional"],
      commentRequiredBelow: null,
    },
    {
      id: "orbit-soundness",
      title: "Orbit and Δv soundness",
      description: "The orbit, transfer and propulsion figures hold together, with margins; read the server's orbit checks.",
      weight: 35,
      scaleMin: 1,
      scaleMax: 5,
      levels: ["Does not close", "Major gaps", "Closes with caveats", "Sound", "Sound with margin"],
      commentRequiredBelow: 3,
    },
    {
      id: "programme-risk",
      title: "Programme risk",
      description: "Heritage, schedule and team; lower risk scores higher.",
      weight: 25,
      scaleMin: 1,
      scaleMax: 5,
      levels: ["Very high", "High", "Moderate", "Low", "Very low"],
      commentRequiredBelow: null,
    },
  ],
};

interface ItemSpec {
  severity: "major" | "minor" | "comment";
  title: string;
  body: string;
  /** Text of the dossier the item is anchored to (found in the version's plain text). */
  quote: string;
}

interface ReviewSpec {
  proposal: string;
  reviewer: PersonKey;
  /** Scores for mission-return, orbit-soundness, programme-risk, with comments. */
  scores?: [number, number, number];
  comments?: [string, string, string];
  summary?: string;
  items?: ItemSpec[];
  /** A note on the server's flag of the block with this label. */
  checkNote?: { label: string; note: string };
  /** "submitted", "draft" (scored, not submitted) or "not started" (assigned only). */
  state: "submitted" | "draft" | "not started";
}

const ASSIGNMENTS: { call: CallKey; proposal: string; reviewers: PersonKey[] }[] = [
  { call: "decided", proposal: "tern-1", reviewers: ["teodor", "ines"] },
  { call: "decided", proposal: "skiff-ep", reviewers: ["ines", "piet"] },
  { call: "decided", proposal: "wisp", reviewers: ["teodor", "piet"] },
  { call: "open", proposal: "lantern", reviewers: ["teodor", "runa"] },
  { call: "open", proposal: "aurora", reviewers: ["ines", "jonas"] },
  { call: "open", proposal: "harrow", reviewers: ["piet", "teodor"] },
  { call: "open", proposal: "sable", reviewers: ["runa", "ines"] },
  { call: "open", proposal: "vesper", reviewers: ["jonas", "runa"] },
];

/** Dossiers left as drafts (everything else is submitted). */
const DRAFTS = new Set(["kite", "glint"]);

const REVIEWS: ReviewSpec[] = [
  {
    proposal: "tern-1",
    reviewer: "teodor",
    state: "submitted",
    scores: [4, 5, 4],
    comments: [
      "A clear user and a clear product.",
      "Every orbit claim checks out and the budget carries a real margin.",
      "Thruster and imager both have heritage.",
    ],
    summary: "A well-argued, well-margined Earth-observation mission. Recommend acceptance.",
    items: [
      {
        severity: "comment",
        title: "Disposal well argued",
        body: "The perigee-lowering burn and the re-entry estimate are exactly what the board wants to see.",
        quote: "re-enters well within the 25-year guideline",
      },
    ],
  },
  {
    proposal: "tern-1",
    reviewer: "ines",
    state: "submitted",
    scores: [4, 4, 4],
    comments: ["Good service case.", "Consistent figures throughout.", "Commissioning plan is realistic."],
    summary: "Sound. One small question on collision avoidance.",
    items: [
      {
        severity: "minor",
        title: "Collision-avoidance allowance",
        body: "Four manoeuvres over five years is on the low side at 540 km; state the conjunction screening threshold you assumed.",
        quote: "covers four manoeuvres over five years",
      },
    ],
  },
  {
    proposal: "skiff-ep",
    reviewer: "ines",
    state: "submitted",
    scores: [4, 2, 3],
    comments: [
      "A useful demonstration for small GEO operators.",
      "The server flags the xenon budget: the tank covers the manoeuvres exactly, with no margin, although the text says it includes 10 %.",
      "Thruster life is comfortable.",
    ],
    summary: "Promising, but the propulsion budget does not close with the margin the call requires.",
    items: [
      {
        severity: "major",
        title: "Xenon budget has no margin",
        body: "With 1450 s and the stated masses the available Δv equals the requirement; the 10 % margin is not in the tank. Resize the xenon load or cut the manoeuvres.",
        quote: "which includes the 10 % margin the call asks for",
      },
    ],
  },
  {
    proposal: "skiff-ep",
    reviewer: "piet",
    state: "submitted",
    scores: [3, 2, 3],
    comments: [
      "Reasonable objectives.",
      "Margin missing (see the server flag) and the low-thrust factor is unsupported.",
      "Radiation dose during the raise needs more analysis.",
    ],
    summary: "Revise: add the margin and justify the low-thrust penalty.",
    items: [
      {
        severity: "minor",
        title: "Source for the low-thrust factor",
        body: "1.35× the impulsive Δv is plausible for a first estimate; cite the trajectory optimisation behind it in the next version.",
        quote: "for the losses of a low-thrust spiral",
      },
    ],
  },
  {
    proposal: "wisp",
    reviewer: "teodor",
    state: "submitted",
    scores: [3, 1, 2],
    comments: [
      "Attractive science for a student mission.",
      "The plane correction is a hundred times too small: the angle was converted to radians and then used in degrees. The real cost exceeds the propulsion available.",
      "Deep-space radio and thermal design without heritage.",
    ],
    summary: "The mission does not close once the plane correction is computed correctly.",
    items: [
      {
        severity: "major",
        title: "Plane correction Δv",
        body: "2·v∞·sin(1°) at the stated excess speed is about 100 m/s, not under 1 m/s; with 62 m/s on board the flyby geometry cannot be reached.",
        quote: "this plane correction costs only",
      },
    ],
  },
  {
    proposal: "wisp",
    reviewer: "piet",
    state: "submitted",
    scores: [3, 2, 2],
    comments: ["Good training value.", "Δv does not close (server flag on the plane correction).", "Radio heritage is missing."],
    summary: "Decline for this round; a lunar-distance pathfinder first would retire the radio risk.",
    items: [
      {
        severity: "minor",
        title: "Radio heritage",
        body: "Plan a test of the X-band radio at lunar distance or on a ground campaign with a representative link budget.",
        quote: "has not flown beyond lunar distance",
      },
    ],
  },
  {
    proposal: "lantern",
    reviewer: "teodor",
    state: "submitted",
    scores: [5, 4, 4],
    comments: [
      "Polar hydrogen mapping is high value.",
      "Claims consistent; the insertion depends on the arrival speed assumed.",
      "Spectrometer heritage is good.",
    ],
    summary: "Strong proposal. Confirm who provides the translunar injection.",
    items: [
      {
        severity: "minor",
        title: "Who performs the injection",
        body: "Confirm the rideshare contract includes the translunar injection; otherwise it belongs in your budget.",
        quote: "is done by the launcher's upper stage",
      },
    ],
  },
  {
    proposal: "lantern",
    reviewer: "runa",
    state: "submitted",
    scores: [4, 4, 3],
    comments: ["Good science.", "Budget has a fair margin.", "Leased antenna time is a schedule risk."],
    summary: "Fundable.",
    items: [
      {
        severity: "comment",
        title: "Maintenance allowance",
        body: "Weekly trims at 100 km sound right; show the trim sizing in an annex.",
        quote: "covers twelve months with weekly trims",
      },
    ],
  },
  {
    proposal: "sable",
    reviewer: "runa",
    state: "submitted",
    scores: [4, 2, 3],
    comments: [
      "Good follow-up to Lantern.",
      "The server flags the budget: the propellant covers the manoeuvres with no margin.",
      "Low periapsis operations are demanding.",
    ],
    summary: "Revise the propellant load.",
    items: [
      {
        severity: "major",
        title: "No margin in the Δv budget",
        body: "The stated 15 % margin is not in the tank; the available Δv equals the requirement.",
        quote: "margin required by our own rules",
      },
    ],
  },
  {
    proposal: "sable",
    reviewer: "ines",
    state: "submitted",
    scores: [4, 3, 3],
    comments: ["Clear objective.", "Figures consistent apart from the budget margin.", "Shared operations with Lantern help."],
    summary: "Acceptable once the margin is fixed.",
    items: [
      {
        severity: "minor",
        title: "Gravity model",
        body: "Name the lunar gravity model and the degree used for the 30 km periapsis prediction.",
        quote: "leaves little room for errors in the lunar gravity model",
      },
    ],
  },
  {
    proposal: "aurora",
    reviewer: "ines",
    state: "submitted",
    scores: [5, 2, 4],
    comments: [
      "Two-point measurements are exactly what the field needs.",
      "The position one hour after periapsis is wrong: the mean anomaly in degrees was used as radians (server flag).",
      "Experienced team.",
    ],
    summary: "Excellent science; correct the anomaly computation.",
    items: [
      {
        severity: "major",
        title: "Degrees used as radians",
        body: "The true anomaly follows from M in radians read as degrees; recompute the instrument timeline.",
        quote: "which gives a true anomaly of",
      },
    ],
  },
  {
    proposal: "aurora",
    reviewer: "jonas",
    state: "draft",
    scores: [4, 3, 4],
    comments: ["Strong.", "", "Good team."],
    summary: "Draft: still reading the orbit section.",
  },
  {
    proposal: "harrow",
    reviewer: "piet",
    state: "draft",
    scores: [4, 2, 3],
    comments: ["Clear user need.", "The inclination belongs to a 500 km orbit, not 800 km (server flag).", ""],
    summary: "Draft.",
    checkNote: { label: "the sun-synchronous inclination", note: "Looks like the value from the first concept at 500 km." },
    items: [
      {
        severity: "major",
        title: "Inclination for the old altitude",
        body: "A sun-synchronous orbit at 800 km needs about 98.6°; the stated value is the 500 km figure.",
        quote: "dawn-dusk and sun-synchronous at",
      },
    ],
  },
  { proposal: "harrow", reviewer: "teodor", state: "not started" },
  { proposal: "vesper", reviewer: "jonas", state: "not started" },
  { proposal: "vesper", reviewer: "runa", state: "not started" },
];

const DECISIONS: { proposal: string; outcome: "accept" | "revise" | "decline" }[] = [
  { proposal: "tern-1", outcome: "accept" },
  { proposal: "skiff-ep", outcome: "revise" },
  { proposal: "wisp", outcome: "decline" },
];

export interface ScenarioResult {
  skipped: boolean;
  boardId: string;
  calls: { decided: string; open: string };
  proposals: Record<string, string>;
  people: Record<PersonKey, SessionUser>;
  decisions: Record<string, string>;
  reviewItems: number;
  attachments: number;
  /** Every orbit-check block of every version 1 as seeded, with the verdict it was built to get. */
  blocks: { proposal: string; blockId: string; label: string; expected: "consistent" | "inconsistent"; mistake: string | null }[];
}

function session(id: string, person: { email: string; name: string; isAdmin: boolean }): SessionUser {
  return { id, email: person.email, name: person.name, isAdmin: person.isAdmin, sessionId: crypto.randomUUID() };
}

async function upload(user: SessionUser, boardId: string, proposalId: string, file: SeedFile): Promise<string> {
  const { attachment, uploadUrl, headers } = await presignAttachmentUpload(user, boardId, proposalId, {
    filename: file.filename,
    contentType: file.contentType,
    size: file.body.length,
  });
  const response = await fetch(uploadUrl, { method: "PUT", headers, body: new Uint8Array(file.body) });
  if (!response.ok) throw new Error(`uploading ${file.filename} to the object store answered ${response.status}`);
  await confirmAttachment(user, boardId, attachment.id);
  return attachment.id;
}

async function writeDraft(user: SessionUser, boardId: string, proposalId: string, doc: Record<string, unknown>) {
  const draft = await getDraft(user, boardId, proposalId);
  const saved = await saveDraft(user, boardId, proposalId, { revision: draft.revision, document: doc });
  if (saved.dropped?.length) throw new Error(`the demo dossier lost parts when saved: ${saved.dropped.join(", ")}`);
}

/** Version 2 keeps version 1's block ids (matched by label), as the editor does when a proposer edits a block. */
function withBlockIdsOf(v2: DossierSpec, v1: DossierSpec): Record<string, unknown> {
  const ids = new Map<string, string>();
  for (const b of v2.blocks) {
    const old = v1.blocks.find((o) => o.label === b.label);
    if (old) ids.set(b.blockId, old.blockId);
  }
  const walk = (node: DossierNode): DossierNode => {
    const attrs = node.attrs ? { ...node.attrs } : undefined;
    if (node.type === "orbitCheck" && attrs) {
      attrs.blockId = ids.get(String(attrs.blockId)) ?? attrs.blockId;
      if (typeof attrs.initialFrom === "string") attrs.initialFrom = ids.get(attrs.initialFrom) ?? attrs.initialFrom;
    }
    return { ...node, ...(attrs ? { attrs } : {}), ...(node.content ? { content: node.content.map(walk) } : {}) };
  };
  return walk(v2.doc) as unknown as Record<string, unknown>;
}

function anchorFor(text: string, quote: string) {
  const from = text.indexOf(quote);
  if (from < 0) throw new Error(`the review item quote "${quote}" is not in the dossier text`);
  return {
    from,
    to: from + quote.length,
    quote,
    prefix: text.slice(Math.max(0, from - 32), from),
    suffix: text.slice(from + quote.length, from + quote.length + 32),
  };
}

/**
 * Seeds the scenario into `board` (the demo board by default). Returns `skipped: true` when
 * the scenario is already there. A decided call that exists but is still open means an
 * earlier run stopped half-way; that is reported rather than patched over.
 */
export async function seedScenario(database: Database, options: { board?: SeedBoard; log?: (message: string) => void } = {}): Promise<ScenarioResult> {
  const log = options.log ?? (() => undefined);
  const board = options.board ?? DEMO_BOARD;
  const boardId = await ensureBoard(database, board);
  const people = {} as Record<PersonKey, SessionUser>;
  for (const person of DEMO_PEOPLE) people[person.key] = session((await ensurePerson(database, boardId, person)).id, person);
  const chair = people.chair;

  const [marker] = await database
    .select({ id: calls.id, closesAt: calls.closesAt })
    .from(calls)
    .where(and(eq(calls.boardId, boardId), eq(calls.title, DECIDED_CALL_TITLE)));
  if (marker) {
    if (marker.closesAt.getTime() > Date.now()) {
      throw new Error(
        `an earlier demo seed stopped half-way ("${DECIDED_CALL_TITLE}" exists but was never closed); stop the demo (npm run demo:stop), remove .data/demo and run npm run demo again`,
      );
    }
    const [open] = await database
      .select({ id: calls.id })
      .from(calls)
      .where(and(eq(calls.boardId, boardId), eq(calls.title, OPEN_CALL_TITLE)));
    return {
      skipped: true,
      boardId,
      calls: { decided: marker.id, open: open?.id ?? "" },
      proposals: {},
      people,
      decisions: {},
      reviewItems: 0,
      attachments: 0,
      blocks: [],
    };
  }

  // The calls. The decided call is created open: proposals can only be submitted (and
  // revised) while a call is open, so it is closed with a direct update at the very end.
  const now = Date.now();
  const decidedCall = await createCall(
    chair,
    boardId,
    callInputSchema.parse({
      title: DECIDED_CALL_TITLE,
      description:
        "Small missions to low Earth orbit, sun-synchronous orbits and GEO by rideshare, up to 250 kg. Dossiers must show every orbit and Δv figure as an orbit check.",
      opensAt: new Date(now - 45 * DAY).toISOString(),
      closesAt: new Date(now + DAY).toISOString(),
      requiredSections: [...REQUIRED_SECTIONS],
      tolerance: { relative: 0.01 },
      reviewersPerProposal: 2,
    }),
  );
  const openCall = await createCall(
    chair,
    boardId,
    callInputSchema.parse({
      title: OPEN_CALL_TITLE,
      description: "Lunar pathfinders, planetary cubesats and eccentric science orbits. Δv budgets must carry at least 10 % margin on the tank.",
      opensAt: new Date(now - 20 * DAY).toISOString(),
      closesAt: new Date(now + 40 * DAY).toISOString(),
      requiredSections: [...REQUIRED_SECTIONS],
      tolerance: { relative: 0.01 },
      reviewersPerProposal: 2,
    }),
  );
  // The board's ground stations, which contact requirements and contact blocks name.
  for (const station of DEMO_STATIONS) await createStation(chair, boardId, stationInput.parse(station));
  // The open call's requirements, set before any dossier is submitted so each is judged.
  for (const r of OPEN_CALL_REQUIREMENTS) await addRequirement(chair, boardId, openCall.id, requirementInputSchema.parse(r));
  const callIds: Record<CallKey, string> = { decided: decidedCall.id, open: openCall.id };
  await saveCallRubric(chair, boardId, decidedCall.id, DEMO_RUBRIC);
  await saveCallRubric(chair, boardId, openCall.id, DEMO_RUBRIC);
  log("calls and rubrics");

  // The dossiers: written, files attached, and (except the drafts) submitted.
  const specs = demoDossiers();
  const proposals: Record<string, string> = {};
  let attachments = 0;
  for (const spec of specs) {
    const owner = people[spec.owner];
    const proposal = await createProposal(owner, boardId, { title: spec.title, missionType: spec.missionType, callId: callIds[spec.call], coauthorIds: [] });
    proposals[spec.key] = proposal.id;
    await writeDraft(owner, boardId, proposal.id, spec.doc as unknown as Record<string, unknown>);
    for (const file of await spec.files()) {
      await upload(owner, boardId, proposal.id, file);
      attachments += 1;
    }
    if (!DRAFTS.has(spec.key)) await submitProposal(owner, boardId, proposal.id);
  }
  log(`${specs.length} dossiers, ${attachments} attachments`);

  // A declared conflict: Runa advised Lumen Fjord Space on Petrel's thrusters.
  await declareConflict(people.runa, boardId, {
    proposalId: proposals.petrel!,
    reason: "I advised Lumen Fjord Space on the thruster selection for this stage in the last year.",
  });

  // Assignments (each e-mails its reviewer through the outbox).
  const assignmentIds = new Map<string, string>();
  for (const a of ASSIGNMENTS) {
    const dueAt = new Date(now + (a.call === "decided" ? 10 : 21) * DAY);
    const result = await assignReviewers(chair, boardId, {
      proposalIds: [proposals[a.proposal]!],
      reviewerIds: a.reviewers.map((r) => people[r].id),
      dueAt,
      confirmLikelyConflicts: false,
    });
    for (const c of result.created) assignmentIds.set(`${a.proposal}:${c.reviewerId}`, c.assignmentId);
  }

  // Reviews and review items.
  const texts = new Map<string, string>();
  for (const spec of specs) texts.set(spec.key, dossierPlainText(spec.doc));
  let reviewItems = 0;
  for (const r of REVIEWS) {
    const reviewer = people[r.reviewer];
    const assignmentId = assignmentIds.get(`${r.proposal}:${reviewer.id}`);
    if (!assignmentId) throw new Error(`no assignment of ${r.reviewer} to ${r.proposal}`);
    if (r.state === "not started") continue;
    for (const item of r.items ?? []) {
      await createReviewItem(reviewer, boardId, {
        proposalId: proposals[r.proposal]!,
        severity: item.severity,
        title: item.title,
        body: item.body,
        anchor: anchorFor(texts.get(r.proposal)!, item.quote),
      });
      reviewItems += 1;
    }
    if (r.checkNote) {
      const screen = await getReviewScreen(reviewer, boardId, assignmentId);
      const check = screen.checks.find((c) => c.label === r.checkNote!.label);
      if (!check) throw new Error(`no orbit check "${r.checkNote.label}" on ${r.proposal}`);
      await saveCheckNote(reviewer, boardId, assignmentId, check.id, { note: r.checkNote.note });
    }
    const [a, b, c] = r.scores!;
    const [ca, cb, cc] = r.comments!;
    const screen = await getReviewScreen(reviewer, boardId, assignmentId);
    const saved = await saveReviewDraft(reviewer, boardId, assignmentId, {
      revision: screen.review.revision,
      scores: { "mission-return": { score: a, comment: ca }, "orbit-soundness": { score: b, comment: cb }, "programme-risk": { score: c, comment: cc } },
      summary: r.summary ?? "",
    });
    if (r.state === "submitted") await submitReview(reviewer, boardId, assignmentId, { revision: saved.revision });
  }
  log(`reviews and ${reviewItems} review items`);

  // Decisions on the decided call, each with the board's letter and the review items the chair lists in it.
  const template = (await getLetterTemplate(chair, boardId)).template;
  const decisions: Record<string, string> = {};
  for (const d of DECISIONS) {
    const items = await listReviewItems(chair, boardId, proposals[d.proposal]!);
    const decision = await createDecision(chair, boardId, proposals[d.proposal]!, {
      outcome: d.outcome,
      letter: template,
      selectedReviewItemIds: items.filter((i) => i.severity !== "comment").map((i) => i.id),
    });
    decisions[d.proposal] = decision.id;
  }
  log("decisions and letters");

  // Skiff-EP revises: version 2 carries the margin, and the chair asks the same reviewers again.
  const tobias = people.tobias;
  const skiffV2 = skiffEp(2);
  await writeDraft(
    tobias,
    boardId,
    proposals["skiff-ep"]!,
    withBlockIdsOf(
      skiffV2,
      specs.find((s) => s.key === "skiff-ep")!,
    ),
  );
  const [ledger] = (await skiffV2.files()).filter((f) => f.contentType === "text/csv");
  if (ledger) {
    await upload(tobias, boardId, proposals["skiff-ep"]!, { ...ledger, filename: "skiff-ep-delta-v-ledger-v2.csv" });
    attachments += 1;
  }
  await submitProposal(tobias, boardId, proposals["skiff-ep"]!);
  await reassignPreviousReviewers(chair, boardId, proposals["skiff-ep"]!, { dueAt: new Date(now + 14 * DAY) });
  log("Skiff-EP version 2 resubmitted and reassigned");

  // The open call's response round: Ayla answers the injection item on Lantern and Teodor, who raised it, agrees.
  await setResponseWindow(chair, boardId, openCall.id, { opensAt: new Date(now - DAY), closesAt: new Date(now + 12 * DAY) });
  const injection = (await listReviewItems(people.ayla, boardId, proposals.lantern!)).find((i) => i.title === "Who performs the injection");
  if (injection) {
    await answerReviewItem(people.ayla, boardId, injection.id, {
      body: "The rideshare contract includes the translunar injection by the upper stage; the signed statement of work is annex C.",
    });
    await recordDisposition(people.teodor, boardId, injection.id, { disposition: "agreed", reason: "Annex C settles it." });
  }
  log("response round open on the open call");

  // Two invitations still out and one the chair withdrew (invented people, reserved domain).
  await createInvitation(chair, boardId, { email: "saoirse.vantongeren@lumenfjord.example.com", name: "Saoirse van Tongeren", role: "proposer" });
  await createInvitation(chair, boardId, { email: "emeka.lindqvist@tarn-propulsion.example.net", name: "Emeka Lindqvist", role: "reviewer" });
  const withdrawn = await createInvitation(chair, boardId, { email: "h.okafor@vellum-astro.example.com", name: "Hana Okafor", role: "reviewer" });
  await revokeInvitation(chair, boardId, withdrawn.id);
  log("invitations");

  // Submissions and the resubmission above needed the call open; now the chair closes it
  // by moving its closing date into the past (the call form allows any closing date).
  await updateCall(
    chair,
    boardId,
    decidedCall.id,
    callInputSchema.parse({
      title: decidedCall.title,
      description: decidedCall.description,
      opensAt: decidedCall.opensAt,
      closesAt: new Date(Date.now() - 60_000).toISOString(),
      requiredSections: decidedCall.requiredSections,
      tolerance: decidedCall.tolerance,
      reviewersPerProposal: decidedCall.reviewersPerProposal,
    }),
  );

  const blocks = specs.flatMap((spec) =>
    spec.blocks.map((b) => ({ proposal: spec.key, blockId: b.blockId, label: b.label, expected: b.expected, mistake: b.mistake })),
  );
  return { skipped: false, boardId, calls: { decided: decidedCall.id, open: openCall.id }, proposals, people, decisions, reviewItems, attachments, blocks };
}
