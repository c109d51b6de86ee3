import "server-only";
import { processOutbox } from "@/lib/mail/outbox";
import { housekeeping } from "./housekeeping";
import { enqueueReviewReminders } from "./review-reminders";
import { runResponseWindowJob } from "./response-windows";

const globalForWorker = globalThis as unknown as {
  visvivaOutboxWorker?: NodeJS.Timeout;
  visvivaReminderJob?: NodeJS.Timeout;
};

/** How often the reminder job looks for reviews due in 3 or 1 days (idempotent per day). */
const REMINDER_INTERVAL_MS = 15 * 60_000;

/**
 * The background work of one app instance, started by instrumentation.ts: the outbox is
 * polled every second (several instances may do so: rows are claimed with SKIP LOCKED) and
 * the review-reminder job and the housekeeping (lib/jobs/housekeeping.ts) run at start and
 * every 15 minutes. If the mail transport or the
 * database is down, a pass fails, is logged, and the next one tries again.
 */
export function startOutboxWorker(intervalMs = Number(process.env.OUTBOX_POLL_MS ?? 1000)): void {
  if (globalForWorker.visvivaOutboxWorker) return;
  let running = false;
  globalForWorker.visvivaOutboxWorker = setInterval(() => {
    if (running) return;
    running = true;
    processOutbox()
      .catch((error) => console.error("[outbox] worker pass failed:", error instanceof Error ? error.message : error))
      .finally(() => {
        running = false;
      });
  }, intervalMs);
  globalForWorker.visvivaOutboxWorker.unref?.();

  const periodic = () =>
    Promise.all([
      enqueueReviewReminders().catch((error) => console.error("[reminders] pass failed:", error instanceof Error ? error.message : error)),
      housekeeping().catch((error) => console.error("[housekeeping] pass failed:", error instanceof Error ? error.message : error)),
      runResponseWindowJob().catch((error) => console.error("[response-round] pass failed:", error instanceof Error ? error.message : error)),
    ]);
  void periodic();
  globalForWorker.visvivaReminderJob = setInterval(periodic, REMINDER_INTERVAL_MS);
  globalForWorker.visvivaReminderJob.unref?.();
}
