// Issue 17, findings 2, 4 and the account items of 6: pre-account takeover, lockout of
// someone else's account, registration enumeration, dummy hash on unknown addresses.
// Sign-in runs through next-auth's own credentials provider (authOptions) against the
// real database; the HTTP flow is covered in accounts-http.test.ts.
import { describe, expect, it, vi } from "vitest";

// Count Argon2 verifications (the real function still runs).
vi.mock("@node-rs/argon2", async (importOriginal) => {
  const real = await importOriginal<typeof import("@node-rs/argon2")>();
  return { ...real, verify: vi.fn(real.verify) };
});
import { and, eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { outboxMessages, signInAttempts, users } from "@/db/schema";
import { authOptions, INVALID_CREDENTIALS, UNVERIFIED_ACCOUNT } from "@/lib/auth/options";
import { verify } from "@node-rs/argon2";
import { registerProposer, REGISTRATION_SENT, requestPasswordReset, resetPassword } from "@/lib/dal/accounts";
import { boardRole } from "@/lib/dal/boards";
import { acceptInvitation, createInvitation, invitationForToken } from "@/lib/dal/invitations";
import { GLOBAL_BACKOFF_AFTER_FAILURES, globalBackoffSeconds } from "@/lib/dal/sessions";
import { AppError } from "@/lib/errors";
import { asSessionUser, createBoard, createBoardWithCast, createUser, TEST_PASSWORD, unique } from "../support/factories";

type Authorize = (credentials: Record<string, string>, req: { headers: Record<string, string> }) => Promise<{ id: string } | null>;
function provider(id: "password" | "link"): Authorize {
  const all = authOptions.providers as unknown as { id: string; options?: { id?: string; authorize: Authorize } }[];
  const p = all.find((x) => (x.options?.id ?? x.id) === id);
  return p!.options!.authorize;
}
let clientCounter = 0;
/** A fresh client address. The provider reads X-Forwarded-For through TRUSTED_PROXY_HOPS (1 in tests). */
const newClient = () => ({ "x-forwarded-for": `10.77.${Math.floor(Math.random() * 250)}.${++clientCounter % 250}, 127.0.0.1` });

async function signIn(email: string, password: string, headers: Record<string, string>): Promise<string | null> {
  try {
    await provider("password")({ email, password }, { headers });
    return null;
  } catch (error) {
    return (error as Error).message;
  }
}

async function failure(promise: Promise<unknown>): Promise<AppError> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error("expected an AppError");
}

async function mailsTo(email: string) {
  return db()
    .select({ kind: outboxMessages.kind, subject: outboxMessages.subject, text: outboxMessages.text })
    .from(outboxMessages)
    .where(sql`${outboxMessages.toAddresses} @> ${JSON.stringify([email])}::jsonb`);
}

const linkToken = (text: string) => /\/sign-in\/link\?token=([^\s)>"]+)/.exec(text)?.[1];
const invitationToken = (text: string) => /\/invitations\/([^\s)>"]+)/.exec(text)?.[1];

describe("pre-account takeover", () => {
  it("keeps an openly registered account unverified until the mailed link is used", async () => {
    const board = await createBoard({ openRegistration: true });
    const email = `${unique("fresh")}@example.org`;
    const answer = await registerProposer({ board: board.slug, email, name: "Odile Brannock", password: "odile's passphrase" }, { ipAddress: "10.3.0.1" });
    expect(answer.message).toBe(REGISTRATION_SENT);
    expect(await signIn(email, "odile's passphrase", newClient())).toBe(UNVERIFIED_ACCOUNT);
    const [mail] = await mailsTo(email);
    const token = decodeURIComponent(linkToken(mail!.text)!);
    expect(await provider("link")({ token }, { headers: newClient() })).toMatchObject({ id: expect.any(String) });
    const [row] = await db().select({ status: users.status }).from(users).where(eq(users.email, email));
    expect(row!.status).toBe("active");
    expect(await signIn(email, "odile's passphrase", newClient())).toBeNull();
  });

  it("does not let an attacker's unverified account receive an invitation meant for the address", async () => {
    const cast = await createBoardWithCast();
    const open = await createBoard({ openRegistration: true });
    const email = `${unique("victim")}@example.org`;
    // The attacker registers the victim's address first, with a password of their choosing.
    await registerProposer({ board: open.slug, email, name: "Attacker", password: "attacker passphrase" }, { ipAddress: "10.3.0.2" });
    const { token } = await createInvitation(asSessionUser(cast.chair), cast.board.id, { email, role: "chair" });
    expect((await invitationForToken(token))?.hasAccount).toBe(false);
    // The owner accepts with the link from their inbox: name and password are theirs now.
    const accepted = await acceptInvitation({ token, name: "Real Owner", password: "the owner's passphrase" });
    expect(accepted.createdAccount).toBe(true);
    const [row] = await db().select({ id: users.id, name: users.name, status: users.status }).from(users).where(eq(users.email, email));
    expect(row).toMatchObject({ name: "Real Owner", status: "active" });
    expect(await boardRole(row!.id, cast.board.id)).toBe("chair");
    expect(await boardRole(row!.id, open.id)).toBeNull();
    expect(await signIn(email, "attacker passphrase", newClient())).toBe(INVALID_CREDENTIALS);
    expect(await signIn(email, "the owner's passphrase", newClient())).toBeNull();
  });

  it("accepts an invitation for an existing account only when signed in as it", async () => {
    const cast = await createBoardWithCast();
    const existing = await createUser();
    const someoneElse = await createUser();
    const { token } = await createInvitation(asSessionUser(cast.chair), cast.board.id, { email: existing.email, role: "reviewer" });
    const anonymous = await failure(acceptInvitation({ token }));
    expect(anonymous.status).toBe(403);
    expect(anonymous.message).toContain(`Sign in as ${existing.email}`);
    expect((await failure(acceptInvitation({ token }, { user: asSessionUser(someoneElse) }))).status).toBe(403);
    expect(await boardRole(existing.id, cast.board.id)).toBeNull();
    expect((await invitationForToken(token))?.status).toBe("pending");
    await acceptInvitation({ token }, { user: asSessionUser(existing) });
    expect(await boardRole(existing.id, cast.board.id)).toBe("reviewer");
  });

  it("mails the pending invitation instead of registering an address that has one", async () => {
    const cast = await createBoardWithCast();
    const open = await createBoard({ openRegistration: true });
    const email = `${unique("invited")}@example.org`;
    const { token: oldToken } = await createInvitation(asSessionUser(cast.chair), cast.board.id, { email, role: "reviewer" });
    const answer = await registerProposer({ board: open.slug, email, name: "Someone", password: "someone's passphrase" }, { ipAddress: "10.3.0.3" });
    expect(answer.message).toBe(REGISTRATION_SENT);
    expect(await db().select({ id: users.id }).from(users).where(eq(users.email, email))).toHaveLength(0);
    const mails = await mailsTo(email);
    const resent = mails.find((m) => m.subject.startsWith("Your invitation"));
    const token = decodeURIComponent(invitationToken(resent!.text)!);
    expect(token).not.toBe(oldToken);
    expect((await invitationForToken(token))?.status).toBe("pending");
    expect(await invitationForToken(oldToken)).toBeNull();
  });
});

describe("registration enumeration and sign-in timing", () => {
  it("answers a registration the same for a new and a taken address, and mails the owner", async () => {
    const board = await createBoard({ openRegistration: true });
    const taken = await createUser();
    const fresh = `${unique("new")}@example.org`;
    const a = await registerProposer({ board: board.slug, email: taken.email, name: "X", password: "some passphrase!" }, { ipAddress: "10.3.0.4" });
    const b = await registerProposer({ board: board.slug, email: fresh, name: "X", password: "some passphrase!" }, { ipAddress: "10.3.0.4" });
    expect(a.message).toBe(b.message);
    expect(await boardRole(taken.id, board.id)).toBeNull();
    expect((await mailsTo(taken.email)).map((m) => m.subject)).toContain("You already have a VisViva account");
  });

  it("verifies a dummy password hash when the address has no account", async () => {
    const before = vi.mocked(verify).mock.calls.length;
    expect(await signIn(`${unique("ghost")}@example.org`, "any passphrase at all", newClient())).toBe(INVALID_CREDENTIALS);
    expect(vi.mocked(verify).mock.calls.length).toBe(before + 1);
  });
});

describe("lockout", () => {
  it("stops only the failing client: the right password from another client still signs in", async () => {
    const user = await createUser();
    const attacker = newClient();
    for (let i = 0; i < 5; i++) expect(await signIn(user.email, `wrong guess ${i}`, attacker)).toBe(INVALID_CREDENTIALS);
    expect(await signIn(user.email, TEST_PASSWORD, attacker)).toMatch(/^Too many failed sign-in attempts/);
    expect(await signIn(user.email, TEST_PASSWORD, newClient())).toBeNull();
  });

  it("backs off failing clients globally per address, but lets a correct password from a new client through", async () => {
    const user = await createUser();
    const clients = Array.from({ length: GLOBAL_BACKOFF_AFTER_FAILURES }, newClient);
    for (const c of clients) expect(await signIn(user.email, "a wrong passphrase", c)).toBe(INVALID_CREDENTIALS);
    expect(globalBackoffSeconds(GLOBAL_BACKOFF_AFTER_FAILURES)).toBeGreaterThan(0);
    // A client that already failed waits, even below its own five failures.
    expect(await signIn(user.email, "another wrong one", clients[0]!)).toMatch(/^Too many failed sign-in attempts/);
    expect(await signIn(user.email, TEST_PASSWORD, newClient())).toBeNull();
  });

  it("clears the address's counters when a password reset is completed", async () => {
    const user = await createUser();
    const client = newClient();
    for (let i = 0; i < 5; i++) await signIn(user.email, `wrong guess ${i}`, client);
    expect(await signIn(user.email, TEST_PASSWORD, client)).toMatch(/^Too many/);
    await requestPasswordReset({ email: user.email }, { ipAddress: `10.4.${++clientCounter % 250}.1` });
    const [mail] = (await mailsTo(user.email)).filter((m) => m.kind === "password-reset");
    const token = decodeURIComponent(/\/sign-in\/reset\?token=([^\s)>"]+)/.exec(mail!.text)![1]!);
    await resetPassword({ token, password: "a brand new passphrase", confirmPassword: "a brand new passphrase" });
    const left = await db()
      .select({ id: signInAttempts.id })
      .from(signInAttempts)
      .where(and(eq(signInAttempts.email, user.email), eq(signInAttempts.succeeded, false)));
    expect(left).toHaveLength(0);
    expect(await signIn(user.email, "a brand new passphrase", client)).toBeNull();
  });
});
