import "server-only";
import { cache } from "react";
import { getServerSession } from "next-auth";
import { unauthenticated } from "@/lib/errors";
import { userForSession, type SessionUser } from "@/lib/dal/sessions";
import { authOptions } from "./options";

export type { SessionUser };

/**
 * The signed-in user of this request, checked against the database on every request: a
 * revoked session or a deactivated account is signed out at once.
 */
export const currentUser = cache(async (): Promise<SessionUser | null> => {
  const session = (await getServerSession(authOptions)) as { sid?: string } | null;
  if (!session?.sid) return null;
  return userForSession(session.sid);
});

export async function requireUser(): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) throw unauthenticated();
  return user;
}
