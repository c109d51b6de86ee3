// Accounts area: boards, members, invitations, my account and the audit log, plus the
// public sign-in link, invitation and registration actions.
import crypto from "node:crypto";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { boards, invitations } from "@/db/schema";
import { newToken } from "@/lib/auth/tokens";
import { unauthenticated } from "@/lib/errors";
import type { SessionUser } from "@/lib/auth/session";
import { changePassword, registerProposer, requestPasswordReset, requestSignInLink, resetPassword, signOutOtherSessions } from "@/lib/dal/accounts";
import { createBoard, updateBoard } from "@/lib/dal/boards";
import { acceptInvitation, createInvitation, revokeInvitation } from "@/lib/dal/invitations";
import { updateMember } from "@/lib/dal/members";
import { addMember, createUser, TEST_PASSWORD, unique } from "../../support/factories";
import type { ActionCase, MatrixCast, MatrixRole, RouteCase } from "./types";

type Expect<T> = Record<MatrixRole, T>;
type Outcome = ActionCase["expect"][MatrixRole];

/** Any signed-in person; anonymous callers get 401. */
const signedIn = <T>(ok: T, anonymous: T): Expect<T> => ({ anonymous, outsider: ok, proposer: ok, reviewer: ok, chair: ok, admin: ok });
/** Members of the board (admins too); the outsider, a chair of another board, gets 404. */
const boardMembers = <T>(ok: T, anonymous: T, hidden: T): Expect<T> => ({ anonymous, outsider: hidden, proposer: ok, reviewer: ok, chair: ok, admin: ok });
/** The board's chairs and admins; proposers and reviewers 403, the outsider 404. */
const chairs = <T>(ok: T, anonymous: T, forbidden: T, hidden: T): Expect<T> => ({
  anonymous,
  outsider: hidden,
  proposer: forbidden,
  reviewer: forbidden,
  chair: ok,
  admin: ok,
});
/** Site admins only. */
const admins = <T>(ok: T, anonymous: T, forbidden: T): Expect<T> => ({
  anonymous,
  outsider: forbidden,
  proposer: forbidden,
  reviewer: forbidden,
  chair: forbidden,
  admin: ok,
});
const everyone = <T>(ok: T): Expect<T> => ({ anonymous: ok, outsider: ok, proposer: ok, reviewer: ok, chair: ok, admin: ok });

async function extraMember(cast: MatrixCast, role: "proposer" | "reviewer" | "chair" = "reviewer") {
  const user = await createUser();
  return addMember(cast.board.id, user.id, role);
}

async function pendingInvitation(cast: MatrixCast) {
  const { token, tokenHash } = newToken();
  const [row] = await db()
    .insert(invitations)
    .values({
      boardId: cast.board.id,
      email: `${unique("matrix-invitee")}@example.org`,
      role: "proposer",
      tokenHash,
      invitedBy: cast.chair.id,
      expiresAt: new Date(Date.now() + 86_400_000),
    })
    .returning({ id: invitations.id });
  return { id: row!.id, token };
}

const boardPath = (cast: MatrixCast) => `/api/v1/boards/${cast.board.id}`;

export const accountRouteCases: RouteCase[] = [
  { operationId: "listBoards", prepare: async () => ({ path: "/api/v1/boards" }), expect: signedIn(200, 401) },
  {
    operationId: "createBoard",
    prepare: async () => ({ path: "/api/v1/boards", body: { name: `Matrix board ${unique("b")}` } }),
    expect: admins(201, 401, 403),
  },
  { operationId: "getBoard", prepare: async (cast) => ({ path: boardPath(cast) }), expect: boardMembers(200, 401, 404) },
  {
    operationId: "updateBoard",
    prepare: async (cast, role) => ({ path: boardPath(cast), body: { description: `Set by ${role}` } }),
    expect: chairs(200, 401, 403, 404),
  },
  {
    operationId: "listBoardMembers",
    prepare: async (cast) => ({ path: `${boardPath(cast)}/members`, query: { sort: "email", dir: "desc", pageSize: "10" } }),
    expect: chairs(200, 401, 403, 404),
  },
  {
    operationId: "updateBoardMember",
    prepare: async (cast) => ({ path: `${boardPath(cast)}/members/${(await extraMember(cast)).id}`, body: { role: "proposer" } }),
    expect: chairs(200, 401, 403, 404),
  },
  { operationId: "listBoardInvitations", prepare: async (cast) => ({ path: `${boardPath(cast)}/invitations` }), expect: chairs(200, 401, 403, 404) },
  {
    operationId: "createBoardInvitation",
    prepare: async (cast) => ({ path: `${boardPath(cast)}/invitations`, body: { email: `${unique("matrix-invite")}@example.org`, role: "reviewer" } }),
    expect: chairs(201, 401, 403, 404),
  },
  {
    operationId: "revokeBoardInvitation",
    prepare: async (cast) => ({ path: `${boardPath(cast)}/invitations/${(await pendingInvitation(cast)).id}` }),
    expect: chairs(200, 401, 403, 404),
  },
  { operationId: "getMe", prepare: async () => ({ path: "/api/v1/me" }), expect: signedIn(200, 401) },
  {
    operationId: "changeMyPassword",
    prepare: async () => ({ path: "/api/v1/me/password", body: { currentPassword: TEST_PASSWORD, newPassword: "a fresh matrix passphrase" } }),
    expect: signedIn(200, 401),
  },
  { operationId: "revokeMyOtherSessions", prepare: async () => ({ path: "/api/v1/me/sessions/revoke-others" }), expect: signedIn(200, 401) },
  { operationId: "listAuditEvents", prepare: async () => ({ path: "/api/v1/admin/audit", query: { pageSize: "10" } }), expect: admins(200, 401, 403) },
];

/** What the `action(...)` wrapper does before the handler: no session, 401. */
function signedInUser(user: SessionUser | null): SessionUser {
  if (!user) throw unauthenticated();
  return user;
}

const someAddress = () => `10.77.${crypto.randomInt(0, 255)}.${crypto.randomInt(1, 255)}`;

export const accountActionCases: ActionCase[] = [
  {
    action: "app/(auth)/sign-in/actions.ts#requestPasswordResetAction",
    run: async (user) => requestPasswordReset({ email: user?.email ?? `${unique("anon")}@example.org` }, { ipAddress: someAddress() }),
    expect: everyone<Outcome>("allow"),
  },
  {
    // Open to anyone holding a valid reset link; a made-up link is refused the same way for everyone.
    action: "app/(auth)/sign-in/reset/actions.ts#resetPasswordAction",
    run: async () => {
      const password = "matrix reset passphrase";
      await resetPassword({ token: newToken().token, password, confirmPassword: password }).then(
        () => {
          throw new Error("a made-up reset link was accepted");
        },
        (error: { status?: number }) => {
          if (error.status !== 422) throw error;
        },
      );
    },
    expect: everyone<Outcome>("allow"),
  },
  {
    action: "app/(auth)/sign-in/actions.ts#requestSignInLinkAction",
    run: async (user) => requestSignInLink({ email: user?.email ?? `${unique("anon")}@example.org` }, { ipAddress: someAddress() }),
    expect: everyone<Outcome>("allow"),
  },
  {
    action: "app/(auth)/invitations/[token]/actions.ts#acceptInvitationAction",
    run: async (_user, cast) =>
      acceptInvitation({ token: (await pendingInvitation(cast)).token, name: "Matrix Invitee", password: "matrix invitee passphrase" }),
    expect: everyone<Outcome>("allow"),
  },
  {
    action: "app/(auth)/boards/[boardId]/register/actions.ts#registerProposerAction",
    run: async (_user, cast) => {
      await db().update(boards).set({ openRegistration: true }).where(eq(boards.id, cast.board.id));
      return registerProposer(
        { board: cast.board.slug, email: `${unique("self")}@example.org`, name: "Self Registered", password: "self registered passphrase" },
        { ipAddress: someAddress() },
      );
    },
    expect: everyone<Outcome>("allow"),
  },
  {
    action: "app/(board)/account/actions.ts#changePasswordAction",
    run: async (user) => changePassword(signedInUser(user), { currentPassword: TEST_PASSWORD, newPassword: "a fresh matrix passphrase" }),
    expect: signedIn<Outcome>("allow", 401),
  },
  {
    action: "app/(board)/account/actions.ts#revokeOtherSessionsAction",
    run: async (user) => signOutOtherSessions(signedInUser(user)),
    expect: signedIn<Outcome>("allow", 401),
  },
  {
    action: "app/(board)/boards/actions.ts#createBoardAction",
    run: async (user) => createBoard(signedInUser(user), { name: `Matrix board ${unique("a")}` }),
    expect: admins<Outcome>("allow", 401, 403),
  },
  {
    action: "app/(board)/boards/[boardId]/settings/actions.ts#updateBoardSettingsAction",
    run: async (user, cast) => updateBoard(signedInUser(user), cast.board.id, { name: cast.board.name, hideProposerNames: true }),
    expect: chairs<Outcome>("allow", 401, 403, 404),
  },
  {
    action: "app/(board)/boards/[boardId]/members/actions.ts#inviteMemberAction",
    run: async (user, cast) => createInvitation(signedInUser(user), cast.board.id, { email: `${unique("matrix-invite")}@example.org`, role: "proposer" }),
    expect: chairs<Outcome>("allow", 401, 403, 404),
  },
  {
    action: "app/(board)/boards/[boardId]/members/actions.ts#updateMemberAction",
    run: async (user, cast) => updateMember(signedInUser(user), cast.board.id, (await extraMember(cast)).id, { status: "deactivated" }),
    expect: chairs<Outcome>("allow", 401, 403, 404),
  },
  {
    action: "app/(board)/boards/[boardId]/members/actions.ts#revokeInvitationAction",
    run: async (user, cast) => revokeInvitation(signedInUser(user), cast.board.id, (await pendingInvitation(cast)).id),
    expect: chairs<Outcome>("allow", 401, 403, 404),
  },
];
