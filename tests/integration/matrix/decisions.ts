// Decisions area: decisions, letters, the letter template, version comparison, the outbox.
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { outboxMessages, proposals } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/session";
import { createDecision, previewDecision, saveLetterTemplate } from "@/lib/decisions";
import { reassignPreviousReviewers } from "@/lib/review/reassign";
import { requeueOutboxMessage } from "@/lib/dal/outbox";
import { DEFAULT_LETTER_TEMPLATE } from "@/lib/decisions/template";
import { unauthenticated } from "@/lib/errors";
import { asSessionUser, unique } from "../../support/factories";
import { addVersion, decisionScenario, dossierDoc, parkingOrbitBlock } from "../decision-fixtures";
import type { ActionCase, MatrixCast, MatrixRole, RouteCase } from "./types";

type Expect = Record<MatrixRole, number | number[]>;
const board = (cast: MatrixCast) => `/api/v1/boards/${cast.board.id}`;

/** The chair decides (and an admin may); authors and reviewers are refused; other boards do not see it. */
const chairWrites: Expect = { anonymous: 401, outsider: 404, proposer: 403, reviewer: 403, chair: 200, admin: 200 };
/** The chair and the proposal's authors read a decision; a reviewer does not learn it exists. */
const decisionReaders: Expect = { anonymous: 401, outsider: 404, proposer: 200, reviewer: 404, chair: 200, admin: 200 };
const adminsOnly: Expect = { anonymous: 401, outsider: 403, proposer: 403, reviewer: 403, chair: 403, admin: 200 };

const letter = { type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text: "Decision on {{proposal.title}}: {{decision.outcome}}." }] }] };

/** A proposal of the cast's proposer, reviewed by the cast's reviewer, ready to decide. */
const ready = (cast: MatrixCast) => decisionScenario({ cast });

async function decided(cast: MatrixCast) {
  const s = await ready(cast);
  const decision = await createDecision(asSessionUser(cast.chair), cast.board.id, s.proposal.id, { outcome: "revise", letter });
  return { ...s, decision };
}

async function failedMessage() {
  const key = unique("matrix-failed");
  const [row] = await db()
    .insert(outboxMessages)
    .values({
      kind: "matrix-test",
      dedupeKey: key,
      toAddresses: [`${key}@test.example.org`],
      subject: key,
      html: key,
      text: key,
      status: "failed",
      attempts: 12,
      lastError: "550 refused",
    })
    .returning({ id: outboxMessages.id });
  return row!.id;
}

async function resubmitted(cast: MatrixCast) {
  const s = await decided(cast);
  await addVersion(
    cast.board,
    s.proposal,
    2,
    dossierDoc("Revised text.", [parkingOrbitBlock(s.blockIds.parkingId, "the parking orbit", 5864)]),
    [],
    cast.proposer.id,
  );
  await db().update(proposals).set({ status: "submitted", latestVersion: 2 }).where(eq(proposals.id, s.proposal.id));
  return s;
}

export const decisionRouteCases: RouteCase[] = [
  {
    operationId: "listProposalDecisions",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await decided(cast)).proposal.id}/decision` }),
    expect: decisionReaders,
  },
  {
    operationId: "createDecision",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await ready(cast)).proposal.id}/decision`, body: { outcome: "accept", letter } }),
    expect: { ...chairWrites, chair: 201, admin: 201 },
  },
  {
    operationId: "previewDecision",
    prepare: async (cast) => ({ path: `${board(cast)}/proposals/${(await ready(cast)).proposal.id}/decision/preview`, body: { outcome: "decline", letter } }),
    expect: chairWrites,
  },
  {
    operationId: "getDecision",
    prepare: async (cast) => ({ path: `${board(cast)}/decisions/${(await decided(cast)).decision.id}` }),
    expect: decisionReaders,
  },
  {
    operationId: "getDecisionLetter",
    prepare: async (cast) => ({ path: `${board(cast)}/decisions/${(await decided(cast)).decision.id}/letter` }),
    expect: decisionReaders,
  },
  { operationId: "listOutbox", prepare: async () => ({ path: "/api/v1/admin/outbox", query: { status: "failed", limit: "5" } }), expect: adminsOnly },
  { operationId: "requeueOutboxMessage", prepare: async () => ({ path: `/api/v1/admin/outbox/${await failedMessage()}/requeue` }), expect: adminsOnly },
];

type ActionExpect = ActionCase["expect"];
const chairAction: ActionExpect = { anonymous: 401, outsider: 404, proposer: 403, reviewer: 403, chair: "allow", admin: "allow" };

/** The action wrapper refuses anonymous callers before the data-access function runs. */
function signedIn(user: SessionUser | null): SessionUser {
  if (!user) throw unauthenticated();
  return user;
}

const decisionPage = "app/(board)/boards/[boardId]/proposals/[proposalId]/decision/actions.ts";

export const decisionActionCases: ActionCase[] = [
  {
    action: `${decisionPage}#previewDecisionAction`,
    run: async (user, cast) =>
      previewDecision(signedIn(user), cast.board.id, (await ready(cast)).proposal.id, { outcome: "accept", letter: DEFAULT_LETTER_TEMPLATE }),
    expect: chairAction,
  },
  {
    action: `${decisionPage}#issueDecisionAction`,
    run: async (user, cast) => createDecision(signedIn(user), cast.board.id, (await ready(cast)).proposal.id, { outcome: "decline", letter }),
    expect: chairAction,
  },
  {
    action: "app/(board)/boards/[boardId]/proposals/[proposalId]/compare/actions.ts#reassignReviewersAction",
    run: async (user, cast) => reassignPreviousReviewers(signedIn(user), cast.board.id, (await resubmitted(cast)).proposal.id),
    expect: chairAction,
  },
  {
    action: "app/(board)/boards/[boardId]/settings/letter/actions.ts#saveLetterTemplateAction",
    run: async (user, cast) => saveLetterTemplate(signedIn(user), cast.board.id, letter),
    expect: chairAction,
  },
  {
    action: "app/(board)/admin/outbox/actions.ts#requeueOutboxMessageAction",
    run: async (user) => requeueOutboxMessage(signedIn(user), await failedMessage()),
    expect: { anonymous: 401, outsider: 403, proposer: 403, reviewer: 403, chair: 403, admin: "allow" },
  },
];
