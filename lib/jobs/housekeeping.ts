import "server-only";
import { cleanUpUnconfirmedUploads, UNCONFIRMED_UPLOAD_MAX_AGE_MS } from "@/lib/dal/attachments";
import { pruneRateLimits } from "@/lib/dal/rate-limits";
import { pruneAccountRecords } from "@/lib/dal/sessions";

export interface HousekeepingReport {
  rateLimitWindows: number;
  signInAttempts: number;
  accountTokens: number;
  sessions: number;
  unconfirmedUploads: number;
}

/**
 * Removes rows and objects that have outlived their use: closed rate-limit windows, old
 * sign-in attempts, spent tokens and ended sessions, and uploads never confirmed (their
 * objects too). Idempotent, safe on several instances at once; run every 15 minutes by the
 * background work of each instance.
 */
export async function housekeeping(now = new Date()): Promise<HousekeepingReport> {
  const rateLimitWindows = await pruneRateLimits();
  const accounts = await pruneAccountRecords(now);
  const unconfirmedUploads = await cleanUpUnconfirmedUploads(new Date(now.getTime() - UNCONFIRMED_UPLOAD_MAX_AGE_MS));
  return { rateLimitWindows, ...accounts, unconfirmedUploads };
}
