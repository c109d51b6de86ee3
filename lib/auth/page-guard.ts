import "server-only";
import { headers } from "next/headers";
import { notFound, redirect } from "next/navigation";
import { isAppError } from "@/lib/errors";
import { clientAddress } from "./options";
import { currentUser, type SessionUser } from "./session";

/** The signed-in user of a page; others are sent to the sign-in page and brought back after. */
export async function pageUser(returnTo: string): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(returnTo)}`);
  return user;
}

/** Runs a data read for a page: a 404 from the policy or the data becomes the not-found page. */
export async function orNotFound<T>(read: Promise<T>): Promise<T> {
  try {
    return await read;
  } catch (error) {
    if (isAppError(error) && error.status === 404) notFound();
    throw error;
  }
}

/** The caller's network address inside a server action, for audit rows and rate limits. */
export async function actionClientAddress(): Promise<string> {
  return clientAddress(await headers());
}
