import { beforeAll, describe, expect, it } from "vitest";
import { appUrl } from "../support/app";
import { is, sql } from "drizzle-orm";
import { PgTable, getTableConfig } from "drizzle-orm/pg-core";
import * as schema from "@/db/schema";
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

  it("has applied every migration to the test database: every table and column the schema declares exists", async () => {
    const declared = (Object.values(schema) as unknown[]).filter((value): value is PgTable => is(value, PgTable)).map((table) => getTableConfig(table));
    expect(declared.length).toBeGreaterThan(20);
    const rows = await db().execute<{ table_name: string; column_name: string }>(
      sql`select table_name, column_name from information_schema.columns where table_schema = 'public'`,
    );
    const present = new Set(rows.rows.map((row) => `${row.table_name}.${row.column_name}`));
    const missing = declared.flatMap((table) => table.columns.map((column) => `${table.name}.${column.name}`)).filter((name) => !present.has(name));
    expect(missing).toEqual([]);
  });

  it("answers an unknown page with our own 404 page, which leads back to the boards", async () => {
    const response = await fetch(`${baseUrl()}/no-such-page-here`);
    expect(response.status).toBe(404);
    const html = await response.text();
    expect(html).toContain("This page is not here");
    expect(html).toContain('href="/boards"');
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
