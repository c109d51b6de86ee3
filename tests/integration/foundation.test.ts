import { beforeAll, describe, expect, it } from "vitest";
import { appUrl } from "../support/app";
import { sql } from "drizzle-orm";
import { db } from "@/db/client";
import { HttpClient, baseUrl } from "../support/http";
import { createBoardWithCast } from "../support/factories";

describe("the app on its real local services", () => {
  beforeAll(async () => {
    await appUrl();
  });

  it("reports every service ok at /api/health", async () => {
    const response = await fetch(`${baseUrl()}/api/health`);
    const body = await response.json();
    expect(response.status).toBe(200);
    expect(body.services).toEqual({ database: "ok", objectStore: "ok", mail: "ok" });
    expect(body.version).toMatch(/^\d+\.\d+\.\d+/);
  });

  it("has applied every migration to the test database", async () => {
    const rows = await db().execute(
      sql`select count(*)::int as n from information_schema.tables where table_name in ('users','boards','proposals','reviews','decisions','outbox_messages')`,
    );
    expect(rows.rows[0]).toEqual({ n: 6 });
  });

  it("lists caught mail as JSON outside production", async () => {
    const response = await fetch(`${baseUrl()}/api/dev/mail`);
    expect(response.status).toBe(200);
    expect(Array.isArray((await response.json()).messages)).toBe(true);
  });

  it("signs in with a password through next-auth and recognises the session", async () => {
    const { chair } = await createBoardWithCast();
    const client = new HttpClient();
    expect(await client.signIn("password", { email: chair.email, password: "wrong password entirely" })).toMatch(/do not match/);
    await client.signInAs(chair.email);
    const session = await (await client.get("/api/auth/session")).json();
    expect(session.user.email).toBe(chair.email);
  });
});
