import "server-only";
import { claimDueMessages, insertOutboxMessage, recordSendFailure, recordSendSuccess, requeueFailedMessage, type OutgoingMail } from "@/lib/dal/outbox-queue";
import type { Tx } from "@/lib/dal/transaction";
import { readObject } from "@/storage/object-store";
import { OUTBOX_MAX_ATTEMPTS } from "./status-text";
import { mailFrom, mailTransport } from "./transport";

/*
 * The outbox is VisViva's e-mail job queue, kept in PostgreSQL on purpose (pg-boss was
 * considered): a message is one row written with a plain INSERT inside the transaction of
 * the write it belongs to (a decision, an invitation), the unique `dedupe_key` makes a
 * second enqueue of the same message a no-op, and the same row is the record admins see
 * (status, attempts, last error, "send again"). Workers claim rows with
 * FOR UPDATE SKIP LOCKED and a lease, so any number of app instances may run one.
 *
 * Delivery guarantees (tests/integration/outbox*.test.ts show each):
 * - nothing is lost: a row leaves `queued`/`sending` only for `sent` (after the SMTP server
 *   accepted it) or `failed` (permanent refusal, or MAX_ATTEMPTS transient failures), and a
 *   failed row can be sent again by an admin;
 * - the transport being down only delays: the row goes back to `queued` with a backoff and
 *   the error is recorded;
 * - a claimed row is only retried after its lease ran out (the worker died or lost the
 *   database), and the result of a send is written with retries so a database restart
 *   during a send does not lead to a second send;
 * - every send of one row carries the same SMTP Message-ID, so in the one window no
 *   queue can close (the worker killed between the server's "250 OK" and the database
 *   write) a receiving server can still drop the copy.
 */

export type { OutgoingMail };

/**
 * Puts a message in the outbox. Pass the transaction of the write the message belongs to
 * (a decision, an invitation) so both commit or neither does; the worker sends it after.
 */
export async function enqueueMail(mail: OutgoingMail, tx?: Tx): Promise<{ id: string; duplicate: boolean }> {
  return insertOutboxMessage(mail, tx);
}

export const MAX_ATTEMPTS = OUTBOX_MAX_ATTEMPTS;

/** How long a claimed message belongs to its worker before another may take it over. */
export const DEFAULT_LEASE_SECONDS = 5 * 60;

/** Seconds before attempt n+1: 5 s, 10 s, 20 s … capped at 15 minutes. */
export function backoffSeconds(attempts: number): number {
  return Math.min(15 * 60, 5 * 2 ** Math.max(0, attempts - 1));
}

/** The part of a nodemailer transport the worker uses (tests pass a wrapped one). */
export interface MailSender {
  sendMail(message: {
    from: string;
    to: string[];
    subject: string;
    html: string;
    text: string;
    attachments: { filename: string; contentType: string; content: Buffer }[];
    messageId: string;
    headers: Record<string, string>;
  }): Promise<{ messageId?: string }>;
}

export interface ProcessOptions {
  /** Most messages claimed in one pass. */
  limit?: number;
  leaseSeconds?: number;
  transport?: MailSender;
  /** Only these rows (a test drives its own messages while other workers run). */
  ids?: string[];
  /** The clock that decides which queued messages are due (the database's now() when left out); leases always run on the database's clock. */
  now?: Date;
}

export interface ProcessReport {
  sent: number;
  /** Went back to the queue for a later attempt. */
  retried: number;
  /** Gave up: permanent refusal or too many attempts. */
  failed: number;
}

/** SMTP 5xx answers (mailbox unknown, message refused) will not change on a retry. */
export function isPermanentFailure(error: unknown): boolean {
  const e = error as { responseCode?: number; code?: string; permanent?: boolean } | null;
  if (!e || typeof e !== "object") return false;
  if (e.permanent === true) return true;
  return typeof e.responseCode === "number" && e.responseCode >= 500 && e.responseCode < 600;
}

class PermanentMailError extends Error {
  readonly permanent = true;
}

function errorText(error: unknown): string {
  return (error instanceof Error ? error.message : String(error)).slice(0, 1000);
}

function sleep(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

/**
 * Writes a send's outcome, retrying while the database is unreachable: the message has
 * left (or definitely not left) by now, and forgetting that would send it again.
 */
async function recordOutcome(write: () => Promise<unknown>): Promise<void> {
  const delays = [250, 500, 1000, 2000, 4000, 8000, 15000, 30000];
  for (let attempt = 0; ; attempt++) {
    try {
      await write();
      return;
    } catch (error) {
      const delay = delays[attempt];
      if (delay === undefined) throw error;
      console.error(`[outbox] could not record a send outcome (${errorText(error)}); retrying in ${delay} ms`);
      await sleep(delay);
    }
  }
}

async function withTimeout<T>(work: Promise<T>, ms: number, what: string): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  try {
    return await Promise.race([
      work,
      new Promise<never>((_, reject) => {
        timer = setTimeout(() => reject(new Error(`${what} took longer than ${Math.round(ms / 1000)} s`)), ms);
      }),
    ]);
  } finally {
    if (timer) clearTimeout(timer);
  }
}

/**
 * Sends what is due, once. Each message is claimed by moving it to `sending` (attempts + 1)
 * under FOR UPDATE SKIP LOCKED, so concurrent workers never take the same row; the outcome
 * is written only if the row is still this worker's claim (same attempt number).
 */
export async function processOutbox(options: number | ProcessOptions = {}): Promise<ProcessReport> {
  const opts: ProcessOptions = typeof options === "number" ? { limit: options } : options;
  const leaseSeconds = opts.leaseSeconds ?? DEFAULT_LEASE_SECONDS;
  const transport: MailSender = opts.transport ?? (mailTransport() as unknown as MailSender);
  const claimed = await claimDueMessages(opts.limit ?? 20, leaseSeconds, opts.ids, opts.now);

  const report: ProcessReport = { sent: 0, retried: 0, failed: 0 };
  for (const message of claimed) {
    let info: { messageId?: string };
    try {
      // Reading attachments happens before any byte goes to the mail server, so a timeout
      // here can never cause a second copy; the SMTP send has its own socket timeouts.
      const attachments = await withTimeout(
        Promise.all(
          message.attachments.map(async (a) => {
            try {
              return { filename: a.filename, contentType: a.contentType, content: await readObject(a.objectKey) };
            } catch (error) {
              const code = (error as { code?: string }).code;
              if (code === "NoSuchKey" || code === "NotFound") throw new PermanentMailError(`The attachment ${a.filename} is missing from the object store.`);
              throw error;
            }
          }),
        ),
        Math.max(1000, (leaseSeconds * 1000) / 4),
        "Reading the attachments",
      );
      info = await transport.sendMail({
        from: mailFrom(),
        to: message.toAddresses,
        subject: message.subject,
        html: message.html,
        text: message.text,
        attachments,
        messageId: `<${message.id}@visviva.local>`,
        headers: { "X-VisViva-Outbox-Id": message.id, "X-VisViva-Kind": message.kind },
      });
    } catch (error) {
      const permanent = isPermanentFailure(error);
      const exhausted = permanent || message.attempts >= MAX_ATTEMPTS;
      if (exhausted) report.failed += 1;
      else report.retried += 1;
      const nextAttemptAt = new Date(Date.now() + backoffSeconds(message.attempts) * 1000);
      await recordOutcome(() => recordSendFailure(message, { status: exhausted ? "failed" : "queued", lastError: errorText(error), nextAttemptAt }));
      continue;
    }
    await recordOutcome(() => recordSendSuccess(message, info.messageId ?? null));
    report.sent += 1;
  }
  return report;
}

/** Puts a failed message back in the queue (admins' "send again"); false unless it had failed. */
export async function requeueMessage(id: string): Promise<boolean> {
  return requeueFailedMessage(id);
}
