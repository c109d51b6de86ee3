// The members, audit and outbox lists count nothing per request (one extra row says "more"),
// and at a seeded scale their statements read every table of more than 10,000 rows through an
// index (EXPLAIN), like the proposals list (dossiers.test.ts) and the overview (overview.test.ts).
import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db, pool } from "@/db/client";
import { auditLogStatement } from "@/lib/dal/audit";
import { memberListStatement } from "@/lib/dal/members";
import { listOutbox, OUTBOX_COUNT_LIMIT, outboxCountsStatement, outboxListStatement } from "@/lib/dal/outbox";
import { PgDialect } from "drizzle-orm/pg-core";
import { auditQuerySchema, memberListQuerySchema, memberSortSchema } from "@/lib/validation/accounts";
import { outboxListQuery } from "@/lib/validation/decisions";
import { asSessionUser, createBoardWithCast, unique } from "../support/factories";

interface PlanNode {
  "Node Type": string;
  "Relation Name"?: string;
  Plans?: PlanNode[];
}
const planNodes = (node: PlanNode): PlanNode[] => [node, ...(node.Plans ?? []).flatMap(planNodes)];

async function seqScansOfBigTables(query: { sql: string; params: unknown[] }, sizes: Map<string, number>): Promise<string[]> {
  const { rows } = await pool().query(`explain (format json) ${query.sql}`, query.params);
  return planNodes((rows[0]["QUERY PLAN"] as { Plan: PlanNode }[])[0]!.Plan)
    .filter((n) => n["Node Type"] === "Seq Scan" && (sizes.get(n["Relation Name"] ?? "") ?? 0) > 10_000)
    .map((n) => n["Relation Name"]!);
}

describe("lists without a count per request", () => {
  it("pages the outbox by one extra row and counts each status only up to its limit", async () => {
    const cast = await createBoardWithCast();
    const tag = unique("outbox-scale");
    // More sent messages than the count limit, so the count stops there.
    await db().execute(sql`
      insert into outbox_messages (kind, dedupe_key, to_addresses, subject, html, text, status, sent_at)
      select 'scale-test', ${tag} || '-' || g, '["someone@example.org"]'::jsonb, 'Scale ' || g, '<p>x</p>', 'x', 'sent', now()
      from generate_series(1, ${OUTBOX_COUNT_LIMIT + 50}) g`);
    const admin = asSessionUser(cast.admin);
    const page = await listOutbox(admin, outboxListQuery.parse({ status: "sent", limit: "5" }));
    expect(page.rows).toHaveLength(5);
    expect(page.hasMore).toBe(true);
    expect(page.countLimit).toBe(OUTBOX_COUNT_LIMIT);
    expect(page.counts.sent).toBe(OUTBOX_COUNT_LIMIT);
    // Newest first, whatever the status.
    const all = await listOutbox(admin, outboxListQuery.parse({ limit: "20" }));
    const times = all.rows.map((r) => r.createdAt);
    expect(times).toEqual([...times].sort().reverse());
  });

  it("reads members, audit events and outbox messages through indexes at a seeded scale (EXPLAIN)", async () => {
    const cast = await createBoardWithCast();
    const tag = unique("scale");
    // 12,000 users on 200 other boards (60 each), 12,000 audit events, 12,000 outbox messages.
    await db().execute(sql`
      with u as (
        insert into users (email, name) select ${tag} || '-' || g || '@example.org', 'Scale member ' || g from generate_series(1, 12000) g returning id, email
      ),
      b as (
        insert into boards (name, slug) select 'Scale board ' || g, ${tag} || '-board-' || g from generate_series(1, 200) g returning id
      ),
      bn as (select id, row_number() over (order by id) - 1 as n from b)
      insert into board_members (board_id, user_id, role)
      select bn.id, u.id, 'reviewer' from (select id, row_number() over (order by id) as r from u) u join bn on bn.n = u.r % 200`);
    await db().execute(sql`
      insert into audit_events (action, actor_email, target, occurred_at)
      select case when g % 10 = 0 then 'member.role-changed' else 'user.signed-in' end, ${tag} || '-' || g || '@example.org', 'board ' || g, now() - g * interval '1 second'
      from generate_series(1, 12000) g`);
    await db().execute(sql`
      insert into outbox_messages (kind, dedupe_key, to_addresses, subject, html, text, status, created_at)
      select 'scale-test', ${tag} || '-' || g, '["someone@example.org"]'::jsonb, 'Scale ' || g, '<p>x</p>', 'x',
        case when g % 100 = 0 then 'failed' else 'sent' end, now() - g * interval '1 second'
      from generate_series(1, 12000) g`);
    await db().execute(sql`analyze users, boards, board_members, audit_events, outbox_messages`);
    const sizes = new Map(
      (
        await pool().query<{ relname: string; n: number }>(
          `select relname, reltuples::float8 as n from pg_class where relname in ('users', 'board_members', 'audit_events', 'outbox_messages')`,
        )
      ).rows.map((r) => [r.relname, r.n]),
    );
    for (const big of ["users", "board_members", "audit_events", "outbox_messages"])
      expect({ big, over: sizes.get(big)! > 10_000 }).toEqual({ big, over: true });

    const cases: { label: string; query: { sql: string; params: unknown[] } }[] = [];
    for (const sort of memberSortSchema.options)
      for (const dir of ["asc", "desc"])
        cases.push({ label: `members ${sort} ${dir}`, query: memberListStatement(cast.board.id, memberListQuerySchema.parse({ sort, dir })).toSQL() });
    cases.push({ label: "members search", query: memberListStatement(cast.board.id, memberListQuerySchema.parse({ q: "scale" })).toSQL() });
    for (const input of [{}, { dir: "asc" }, { page: "3" }, { action: "member.role-changed" }])
      cases.push({ label: `audit ${JSON.stringify(input)}`, query: auditLogStatement(auditQuerySchema.parse(input)).toSQL() });
    for (const status of [undefined, "queued", "sending", "sent", "failed"] as const)
      cases.push({ label: `outbox ${status ?? "all"}`, query: outboxListStatement(outboxListQuery.parse({ status })).toSQL() });
    cases.push({ label: "outbox counts", query: new PgDialect().sqlToQuery(outboxCountsStatement()) });
    for (const { label, query } of cases) expect({ label, scans: await seqScansOfBigTables(query, sizes) }).toEqual({ label, scans: [] });
  });
});
