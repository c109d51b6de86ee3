import "server-only";
import { cache } from "react";
import { cookies } from "next/headers";
import { getToken } from "next-auth/jwt";
import { unauthenticated } from "@/lib/errors";
import { userForSession, type SessionUser } from "@/lib/dal/sessions";
import { authOptions } from "./options";

/**
 * The session id in the request's session cookie. This reads the cookie's encrypted JWT
 * directly (next-auth's getToken: the same cookie name, secret and expiry check) instead of
 * getServerSession, which runs next-auth's whole session handler on every request: it decrypts
 * the token, runs both callbacks and encrypts a renewed token that a route handler cannot set
 * anyway. Only the cookie counts (no Authorization header), as with getServerSession.
 */
async function sessionIdFromCookie(): Promise<string | null> {
  const store = await cookies();
  const token = await getToken({
    req: { cookies: store, headers: {} } as never,
    secret: authOptions.secret,
    logger: { error: () => undefined, warn: () => undefined, debug: () => undefined } as never,
  });
  const sid = (token as { sid?: unknown } | null)?.sid;
  return typeof sid === "string" && sid.length > 0 ? sid : null;
}

export type { SessionUser };

/**
 * The signed-in user of this request, checked against the database on every request: a
 * revoked session or a deactivated account is signed out at once.
 */
export const currentUser = cache(async (): Promise<SessionUser | null> => {
  const sid = await sessionIdFromCookie();
  if (!sid) return null;
  return userForSession(sid);
});

export async function requireUser(): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) throw unauthenticated();
  return user;
}
