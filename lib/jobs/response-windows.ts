import "server-only";
import { enqueueResponseWindowMails } from "@/lib/dal/responses";

/**
 * The response-round e-mails: opening (when a window's start date arrives), a reminder 2 days
 * before its end, and closing. Each goes out once per window (the dal claims the stage on the
 * window row and the outbox dedupes); run by the outbox worker every 15 minutes.
 */
export async function runResponseWindowJob(now: Date = new Date()): Promise<{ windows: number }> {
  return enqueueResponseWindowMails(now);
}
