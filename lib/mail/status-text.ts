import { formatDateTime } from "@/lib/format/dates";
/**
 * Says in words what happened to an outbox message and what comes next, for the chair's
 * decision page and the admin outbox. Pure (no server-only imports), so the browser can use it.
 */
/** Transient failures before the outbox gives a message up (lib/mail/outbox.ts uses this one). */
export const OUTBOX_MAX_ATTEMPTS = 12;

export interface OutboxState {
  status: string;
  attempts: number;
  lastError: string | null;
  nextAttemptAt?: string | null;
  sentAt?: string | null;
}

const at = (iso: string | null | undefined) => (iso ? formatDateTime(iso) : null);
const attemptsText = (n: number) => `${n} ${n === 1 ? "attempt" : "attempts"}`;

export function outboxStatusText(m: OutboxState, maxAttempts = OUTBOX_MAX_ATTEMPTS): string {
  const error = m.lastError ? ` The mail server said: “${m.lastError}”.` : "";
  switch (m.status) {
    case "sent":
      return `Sent: the mail server accepted it${at(m.sentAt) ? ` on ${at(m.sentAt)}` : ""}${m.attempts > 1 ? ` after ${attemptsText(m.attempts)}` : ""}. Nothing more to do.`;
    case "failed":
      return `Not sent: delivery was given up after ${attemptsText(m.attempts)}.${error} Check the address; an administrator can send it again from the Outbox page.`;
    case "sending":
      // `attempts` already counts the try in progress.
      return m.attempts > 1
        ? `Being sent again now (attempt ${m.attempts} of at most ${maxAttempts}).${error} If this try fails too, it is retried automatically.`
        : "Being handed to the mail server now (first attempt). Nothing to do.";
    default: {
      if (m.attempts === 0) return "Waiting to be sent: it goes out with the mail sender's next run. Nothing to do.";
      const next = at(m.nextAttemptAt);
      return `Not delivered yet: ${attemptsText(m.attempts)} failed.${error} The next try is ${next ? `at ${next}` : "soon"}, automatically (up to ${maxAttempts} attempts); nothing to do unless it finally fails.`;
    }
  }
}
