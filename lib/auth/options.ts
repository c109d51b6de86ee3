import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { recordAudit } from "@/lib/dal/audit";
import {
  consumeAccountToken,
  findUserForSignIn,
  markAddressVerified,
  openSession,
  recordSignInAttempt,
  revokeSession,
  SESSION_DAYS,
  signInRetryAfter,
} from "@/lib/dal/sessions";
import { clientAddressFrom } from "@/lib/http/client-address";
import { safeRedirect } from "./callback-url";
import { verifyPasswordOrDummy } from "./passwords";
import { formatWait } from "@/lib/format/dates";
import { env } from "@/lib/env";

type HeaderBag = Record<string, string | string[] | undefined> | Headers | undefined;

function header(headers: HeaderBag, name: string): string | null {
  if (!headers) return null;
  if (headers instanceof Headers) return headers.get(name);
  const value = headers[name];
  return Array.isArray(value) ? (value[0] ?? null) : (value ?? null);
}

/** The client's address, trusting X-Forwarded-For only as far as TRUSTED_PROXY_HOPS says (lib/http/client-address.ts). */
export function clientAddress(headers: HeaderBag): string {
  return clientAddressFrom(header(headers, "x-forwarded-for"), env().TRUSTED_PROXY_HOPS);
}

/** Message shown on the sign-in page; next-auth passes it through as the `error` parameter. */
export function tooManyAttemptsMessage(retryAfterSeconds: number): string {
  return `Too many failed sign-in attempts. Try again ${formatWait(retryAfterSeconds)}.`;
}

export const INVALID_CREDENTIALS = "That e-mail and password do not match an active account.";
export const UNVERIFIED_ACCOUNT =
  "Confirm your e-mail address first: open the link we mailed when you registered. No mail? Ask for a sign-in link below; it confirms the address too.";

export const authOptions: NextAuthOptions = {
  secret: process.env.NEXTAUTH_SECRET,
  session: { strategy: "jwt", maxAge: SESSION_DAYS * 86_400 },
  pages: { signIn: "/sign-in", error: "/sign-in" },
  providers: [
    CredentialsProvider({
      id: "password",
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(credentials, req) {
        const email = String(credentials?.email ?? "")
          .trim()
          .toLowerCase();
        const password = String(credentials?.password ?? "");
        const ipAddress = clientAddress(req?.headers as HeaderBag);
        if (!email || !password) throw new Error("Enter your e-mail and password.");
        const retryAfter = await signInRetryAfter(email, ipAddress);
        if (retryAfter > 0) {
          await recordAudit({ action: "sign-in.rate-limited", actorEmail: email, ipAddress });
          throw new Error(tooManyAttemptsMessage(retryAfter));
        }
        const user = await findUserForSignIn(email);
        // Always one hash check (a dummy one without an account), so timing does not tell who has one.
        const passwordOk = await verifyPasswordOrDummy(user?.passwordHash, password);
        if (user?.status === "unverified" && passwordOk) {
          throw new Error(UNVERIFIED_ACCOUNT);
        }
        const ok = user !== null && user.status === "active" && passwordOk;
        await recordSignInAttempt(email, ipAddress, ok);
        if (!ok || !user) {
          await recordAudit({ action: "sign-in.failed", actorEmail: email, ipAddress, details: { method: "password" } });
          throw new Error(INVALID_CREDENTIALS);
        }
        const sessionId = await openSession(user.id, { userAgent: header(req?.headers as HeaderBag, "user-agent"), ipAddress });
        await recordAudit({ action: "sign-in", actorId: user.id, actorEmail: user.email, ipAddress, details: { method: "password" } });
        return { id: user.id, email: user.email, name: user.name, sessionId };
      },
    }),
    CredentialsProvider({
      id: "link",
      name: "Sign-in link",
      credentials: { token: { label: "Token", type: "text" } },
      async authorize(credentials, req) {
        const token = String(credentials?.token ?? "");
        const ipAddress = clientAddress(req?.headers as HeaderBag);
        const email = token ? await consumeAccountToken("sign-in-link", token) : null;
        const user = email ? await findUserForSignIn(email) : null;
        // Using a mailed link proves the address: an unverified (openly registered) account becomes active.
        if (user?.status === "unverified" && (await markAddressVerified(user.id))) {
          user.status = "active";
          await recordAudit({ action: "account.verified", actorId: user.id, actorEmail: user.email, ipAddress, details: { method: "link" } });
        }
        if (!user || user.status !== "active") {
          await recordAudit({ action: "sign-in.failed", actorEmail: email, ipAddress, details: { method: "link" } });
          throw new Error("This sign-in link is invalid, already used or expired. Ask for a new one.");
        }
        await recordSignInAttempt(user.email, ipAddress, true);
        const sessionId = await openSession(user.id, { userAgent: header(req?.headers as HeaderBag, "user-agent"), ipAddress });
        await recordAudit({ action: "sign-in", actorId: user.id, actorEmail: user.email, ipAddress, details: { method: "link" } });
        return { id: user.id, email: user.email, name: user.name, sessionId };
      },
    }),
  ],
  events: {
    async signOut({ token }) {
      const sessionId = (token as { sid?: string } | null)?.sid;
      if (sessionId) await revokeSession(sessionId);
    },
  },
  callbacks: {
    // A malformed callbackUrl (in a query, form or cookie) goes home instead of throwing.
    async redirect({ url, baseUrl }) {
      return safeRedirect(url, baseUrl);
    },
    async jwt({ token, user }) {
      if (user) {
        token.uid = user.id;
        token.sid = (user as { sessionId?: string }).sessionId;
      }
      return token;
    },
    async session({ session, token }) {
      return { ...session, uid: token.uid, sid: token.sid } as typeof session;
    },
  },
};
