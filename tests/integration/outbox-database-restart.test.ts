// A real PostgreSQL restart (pg_ctl stop, then start) with mail waiting in the outbox: the
// queued message survives, is sent exactly once afterwards, and the running app recovers its
// connections on its own (health back to ok) without a restart of its own. Meanwhile the
// public orbit check, which needs no database, keeps answering.
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { outboxMessages } from "@/db/schema";
import { enqueueMail } from "@/lib/mail/outbox";
import { portAnswers, startOneService, stopServices } from "../../scripts/services";
import { serviceConfig } from "../../scripts/service-config";
import { appUrl } from "../support/app";
import { unique } from "../support/factories";
import { baseUrl } from "../support/http";
import { caughtFor, deliver, makeDue, waitFor } from "./outbox-support";

// Due only in 2200, so the app's own worker leaves it to this test until makeDue().
const HIDDEN = new Date("2200-01-01T00:00:00Z");

describe("the outbox across a database restart", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("keeps the queued message, sends it once after the restart, and the app reconnects", async () => {
    const key = unique("outbox-restart");
    const { id } = await db().transaction(async (tx) => {
      const queued = await enqueueMail(
        { kind: "outbox-test", dedupeKey: key, to: [`${key}@test.example.org`], subject: `Restart ${key}`, html: `<p>${key}</p>`, text: key },
        tx,
      );
      await tx.update(outboxMessages).set({ nextAttemptAt: HIDDEN }).where(eq(outboxMessages.id, queued.id));
      return queued;
    });

    const port = serviceConfig("test").postgres.port;
    stopServices("test", "postgres");
    try {
      expect(await portAnswers(port)).toBe(false);
      // While the database is down, the app says so instead of failing silently.
      const down = await fetch(`${baseUrl()}/api/health`);
      expect(down.status).toBe(503);
      expect((await down.json()).services.database).not.toBe("ok");
      // The public orbit check needs no database: it keeps answering, limited per instance.
      const check = await fetch(`${baseUrl()}/api/v1/orbit-checks`, {
        method: "POST",
        headers: { "content-type": "application/json", "x-forwarded-for": "192.0.2.77" },
        body: JSON.stringify({ claims: [{ kind: "orbit", body: "earth", given: { altitude: 500 }, claimed: { period: 5677 } }] }),
      });
      expect(check.status).toBe(200);
      expect((await check.json()).results[0].status).toBe("consistent");
    } finally {
      await startOneService("test", "postgres");
    }

    // The pool drops the connections the restart killed and opens new ones.
    await waitFor(
      async () => {
        try {
          await db().select({ id: outboxMessages.id }).from(outboxMessages).where(eq(outboxMessages.id, id));
          return true;
        } catch {
          return false;
        }
      },
      30_000,
      "the test's own connections to come back",
    );
    const [row] = await db().select({ status: outboxMessages.status, attempts: outboxMessages.attempts }).from(outboxMessages).where(eq(outboxMessages.id, id));
    expect(row).toEqual({ status: "queued", attempts: 0 });

    await makeDue([id]);
    const rows = await deliver([id]);
    expect(rows.map((r) => r.status)).toEqual(["sent"]);
    await waitFor(async () => (await caughtFor(id)).length === 1, 15_000, "the message at the catcher");
    await new Promise((r) => setTimeout(r, 2_500)); // give every worker a few more passes
    expect(await caughtFor(id)).toHaveLength(1);

    await waitFor(async () => (await fetch(`${baseUrl()}/api/health`)).status === 200, 30_000, "the app's health to be ok again");
  });
});
