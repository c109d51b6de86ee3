// The outbox under faults, against the real mail catcher and PostgreSQL: transport down,
// permanent refusal, a worker killed mid-send, concurrent workers, and the database dropping
// the worker's connections between the send and its record. Each message must arrive once.
import { spawn } from "node:child_process";
import path from "node:path";
import { eq, inArray, sql } from "drizzle-orm";
import { Client } from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

// Name this process's database connections so the "database restart" case can drop exactly
// these (other engineers' apps share the test database). Must happen before db() is first used.
const APP_NAME = `visviva-outbox-test-${process.pid}`;
process.env.DATABASE_URL = `${process.env.DATABASE_URL}${process.env.DATABASE_URL?.includes("?") ? "&" : "?"}application_name=${APP_NAME}`;

import { db } from "@/db/client";
import { outboxMessages } from "@/db/schema";
import { backoffSeconds, enqueueMail, MAX_ATTEMPTS, processOutbox, requeueMessage, type MailSender } from "@/lib/mail/outbox";
import { mailTransport } from "@/lib/mail/transport";
import { writeObject } from "@/storage/object-store";
import { startOneService, stopServices, portAnswers } from "../../scripts/services";
import { serviceConfig } from "../../scripts/service-config";
import { unique } from "../support/factories";
import { caughtFor, deliver, makeDue, rowsOf, waitFor } from "./outbox-support";

/**
 * The test app servers' own workers poll the same database. A message made "hidden" is due
 * only in 2200, so no other worker takes it; this file's passes use that clock (`now: AFTER`).
 */
const HIDDEN = new Date("2200-01-01T00:00:00Z");
const AFTER = new Date("2200-01-01T00:00:01Z");

async function newMessage(label: string, extra: { attachments?: { filename: string; objectKey: string; contentType: string }[]; hidden?: boolean } = {}) {
  const key = unique(`outbox-test-${label}`);
  const { hidden = true, attachments } = extra;
  return db().transaction(async (tx) => {
    const { id } = await enqueueMail(
      { kind: "outbox-test", dedupeKey: key, to: [`${key}@test.example.org`], subject: `Outbox test ${key}`, html: `<p>${key}</p>`, text: key, attachments },
      tx,
    );
    if (hidden) await tx.update(outboxMessages).set({ nextAttemptAt: HIDDEN }).where(eq(outboxMessages.id, id));
    return id;
  });
}

async function ensureCatcherUp() {
  const config = serviceConfig("test");
  if (!(await portAnswers(config.smtp.port))) await startOneService("test", "mail");
}

describe("the outbox", () => {
  beforeAll(async () => {
    const [row] = (await db().execute(sql`select current_setting('application_name') as name`)).rows as { name: string }[];
    expect(row?.name).toBe(APP_NAME);
  });

  afterAll(async () => {
    await ensureCatcherUp();
  });

  it("ignores a second enqueue with the same dedupe key", async () => {
    const key = unique("dedupe");
    const mail = { kind: "outbox-test", dedupeKey: key, to: ["x@test.example.org"], subject: key, html: key, text: key };
    const first = await enqueueMail(mail);
    const second = await enqueueMail({ ...mail, subject: "changed" });
    expect(second).toEqual({ id: first.id, duplicate: true });
    const rows = await db().select({ subject: outboxMessages.subject }).from(outboxMessages).where(eq(outboxMessages.dedupeKey, key));
    expect(rows).toEqual([{ subject: key }]);
  });

  it("keeps messages queued with the error while the mail transport is down, then sends each exactly once", async () => {
    const ids = [await newMessage("down-a"), await newMessage("down-b")];
    stopServices("test", "mail");
    try {
      await waitFor(async () => !(await portAnswers(serviceConfig("test").smtp.port)), 10_000, "the catcher to stop");
      const report = await processOutbox({ ids, now: AFTER });
      expect(report).toEqual({ sent: 0, retried: 2, failed: 0 });
      const rows = await rowsOf(ids);
      for (const row of rows) {
        expect(row.status).toBe("queued");
        expect(row.attempts).toBe(1);
        expect(row.lastError).toMatch(/ECONNREFUSED|connect|Connection/i);
        expect(row.nextAttemptAt.getTime()).toBeGreaterThan(Date.now());
      }
      // A pass before the backoff is over does not touch them.
      expect((await processOutbox({ ids })).sent).toBe(0);
    } finally {
      await startOneService("test", "mail");
    }
    await makeDue(ids);
    const rows = await deliver(ids);
    expect(rows.map((r) => r.status)).toEqual(["sent", "sent"]);
    // More passes later send nothing again.
    await makeDue(ids);
    await processOutbox({ ids });
    for (const id of ids) expect(await caughtFor(id)).toHaveLength(1);
  });

  it("backs off 5 s, 10 s, 20 s … up to 15 minutes", () => {
    expect([1, 2, 3, 4].map(backoffSeconds)).toEqual([5, 10, 20, 40]);
    expect(backoffSeconds(30)).toBe(900);
  });

  it("marks a permanent refusal failed at once, and sends it after an admin's requeue", async () => {
    const id = await newMessage("refused");
    const refusing: MailSender = {
      sendMail: async () => {
        throw Object.assign(new Error("550 5.1.1 mailbox unavailable"), { responseCode: 550 });
      },
    };
    const report = await processOutbox({ ids: [id], transport: refusing, now: AFTER });
    expect(report).toEqual({ sent: 0, retried: 0, failed: 1 });
    const [failed] = await rowsOf([id]);
    expect(failed).toMatchObject({ status: "failed", attempts: 1, lastError: "550 5.1.1 mailbox unavailable" });
    // Failed rows stay failed until someone asks.
    await processOutbox({ ids: [id], now: AFTER });
    expect((await rowsOf([id]))[0]?.status).toBe("failed");

    expect(await requeueMessage(id)).toBe(true);
    expect(await requeueMessage(id)).toBe(false); // only failed rows can be requeued
    await deliver([id]);
    expect(await caughtFor(id)).toHaveLength(1);
  });

  it("gives up after MAX_ATTEMPTS transient failures and records the last error", async () => {
    const id = await newMessage("exhausted");
    await db()
      .update(outboxMessages)
      .set({ attempts: MAX_ATTEMPTS - 1 })
      .where(eq(outboxMessages.id, id));
    const flaky: MailSender = {
      sendMail: async () => {
        throw Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:1"), { code: "ECONNECTION" });
      },
    };
    expect(await processOutbox({ ids: [id], transport: flaky, now: AFTER })).toEqual({ sent: 0, retried: 0, failed: 1 });
    expect((await rowsOf([id]))[0]).toMatchObject({ status: "failed", attempts: MAX_ATTEMPTS, lastError: "connect ECONNREFUSED 127.0.0.1:1" });
  });

  it("retries once a message whose worker process was killed after claiming it, and never while its lease runs", async () => {
    const child = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", path.join(__dirname, "outbox-crash-worker.ts")], {
      cwd: path.resolve(__dirname, "../.."),
      env: process.env,
      stdio: ["pipe", "pipe", "pipe"],
    });
    let output = "";
    child.stdout.on("data", (d) => (output += String(d)));
    child.stderr.on("data", (d) => (output += String(d)));
    await waitFor(async () => output.includes("ready"), 60_000, `the crash worker to start (${output})`);
    // The message is enqueued only now and handed over at once; should another app's worker
    // still win the row, the round is repeated with a fresh message.
    let id = "";
    for (let round = 0; round < 5 && !output.includes("claimed"); round++) {
      id = await newMessage(`killed-${round}`, { hidden: false });
      child.stdin.write(`${id}\n`);
      await waitFor(async () => output.includes("claimed") || output.split("missed").length > round + 1, 30_000, "the crash worker to try");
    }
    expect(output).toContain("claimed");
    const exited = new Promise((resolve) => child.once("exit", resolve));
    child.kill("SIGKILL");
    await exited;

    const [stuck] = await rowsOf([id]);
    expect(stuck).toMatchObject({ status: "sending", attempts: 1 });
    // Within the lease the claim still belongs to the (dead) worker: nobody sends.
    expect(await processOutbox({ ids: [id] })).toEqual({ sent: 0, retried: 0, failed: 0 });

    // The lease runs out (a short one here instead of waiting five minutes); two workers
    // race for the row; it is sent once.
    await new Promise((r) => setTimeout(r, 1100));
    const reports = await Promise.all([processOutbox({ ids: [id], leaseSeconds: 1 }), processOutbox({ ids: [id], leaseSeconds: 1 })]);
    expect(reports.reduce((n, r) => n + r.sent, 0)).toBe(1);
    const [after] = await rowsOf([id]);
    expect(after).toMatchObject({ status: "sent", attempts: 2 });
    await processOutbox({ ids: [id], leaseSeconds: 1 });
    expect(await caughtFor(id)).toHaveLength(1);
  });

  it("sends each message once when concurrent workers race for the same rows", async () => {
    const ids = await Promise.all([1, 2, 3, 4, 5].map((n) => newMessage(`race-${n}`)));
    const reports = await Promise.all([1, 2, 3].map(() => processOutbox({ ids, now: AFTER })));
    expect(reports.reduce((n, r) => n + r.sent, 0)).toBe(5);
    for (const id of ids) expect(await caughtFor(id)).toHaveLength(1);
  });

  it("records a send made just before the database dropped the worker's connections, without sending again", async () => {
    const id = await newMessage("db-restart");
    const killer = new Client({ connectionString: process.env.DATABASE_URL!.replace(APP_NAME, `${APP_NAME}-killer`) });
    await killer.connect();
    let terminated = 0;
    const sendThenDropDatabase: MailSender = {
      sendMail: async (message) => {
        const info = await (mailTransport() as unknown as MailSender).sendMail(message);
        // What a database restart looks like to this process: every connection it holds ends.
        const result = await killer.query("select pg_terminate_backend(pid) as ok from pg_stat_activity where application_name = $1", [APP_NAME]);
        terminated = result.rowCount ?? 0;
        return info;
      },
    };
    try {
      const report = await processOutbox({ ids: [id], transport: sendThenDropDatabase, now: AFTER });
      expect(terminated).toBeGreaterThan(0);
      expect(report.sent).toBe(1);
    } finally {
      await killer.end();
    }
    expect((await rowsOf([id]))[0]).toMatchObject({ status: "sent", attempts: 1 });
    await processOutbox({ ids: [id], leaseSeconds: 1 });
    expect(await caughtFor(id)).toHaveLength(1);
  });

  it("sends attachments from the object store, and fails a message whose attachment is gone", async () => {
    const key = `tests/outbox/${unique("att")}/note.txt`;
    await writeObject(key, "attached bytes", "text/plain");
    const withFile = await newMessage("attachment", { attachments: [{ filename: "note.txt", objectKey: key, contentType: "text/plain" }] });
    const missing = await newMessage("missing", {
      attachments: [{ filename: "gone.pdf", objectKey: `tests/outbox/${unique("none")}/gone.pdf`, contentType: "application/pdf" }],
    });
    await deliver([withFile]);
    const [caught] = await caughtFor(withFile);
    expect(caught?.attachments.map((a) => [a.filename, Buffer.from(a.contentBase64, "base64").toString()])).toEqual([["note.txt", "attached bytes"]]);
    expect(await processOutbox({ ids: [missing], now: AFTER })).toEqual({ sent: 0, retried: 0, failed: 1 });
    expect((await rowsOf([missing]))[0]?.lastError).toMatch(/gone\.pdf is missing/);
    const statuses = await db()
      .select({ status: outboxMessages.status })
      .from(outboxMessages)
      .where(inArray(outboxMessages.id, [withFile, missing]));
    expect(statuses.map((s) => s.status).sort()).toEqual(["failed", "sent"]);
  });
});
