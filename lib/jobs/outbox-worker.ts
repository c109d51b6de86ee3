import "server-only";
import { processOutbox } from "@/lib/mail/outbox";

const globalForWorker = globalThis as unknown as { visvivaOutboxWorker?: NodeJS.Timeout };

/**
 * Polls the outbox in this app instance. Several instances may run it at once: messages
 * are claimed with SKIP LOCKED. If the mail transport is down, messages wait and retry.
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
}
