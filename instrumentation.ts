// Next.js calls register() once per server instance at start-up.
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { env } = await import("@/lib/env");
  env(); // refuse to start with missing or invalid variables (the message lists them)
  if (process.env.OUTBOX_WORKER !== "off") {
    const { startOutboxWorker } = await import("@/lib/jobs/outbox-worker");
    startOutboxWorker();
  }
}
