import { describe, expect, it } from "vitest";
import { outboxStatusText } from "./status-text";

describe("outbox status in words", () => {
  it("says what happened and what comes next", () => {
    expect(outboxStatusText({ status: "queued", attempts: 0, lastError: null }, 12)).toBe(
      "Waiting to be sent: it goes out with the mail sender's next run. Nothing to do.",
    );
    expect(outboxStatusText({ status: "queued", attempts: 1, lastError: "connection refused", nextAttemptAt: "2031-05-01T09:05:00Z" }, 12)).toBe(
      "Not delivered yet: 1 attempt failed. The mail server said: “connection refused”. The next try is at 1 May 2031, 09:05 UTC, automatically (up to 12 attempts); nothing to do unless it finally fails.",
    );
    expect(outboxStatusText({ status: "sent", attempts: 1, lastError: null, sentAt: "2031-05-01T09:00:00Z" }, 12)).toBe(
      "Sent: the mail server accepted it on 1 May 2031, 09:00 UTC. Nothing more to do.",
    );
    expect(outboxStatusText({ status: "failed", attempts: 12, lastError: "mailbox unavailable" }, 12)).toContain(
      "Not sent: delivery was given up after 12 attempts. The mail server said: “mailbox unavailable”.",
    );
    // A message being sent counts the try in progress as an attempt.
    expect(outboxStatusText({ status: "sending", attempts: 1, lastError: null }, 12)).toBe(
      "Being handed to the mail server now (first attempt). Nothing to do.",
    );
    expect(outboxStatusText({ status: "sending", attempts: 3, lastError: "timeout" }, 12)).toBe(
      "Being sent again now (attempt 3 of at most 12). The mail server said: “timeout”. If this try fails too, it is retried automatically.",
    );
  });
});
