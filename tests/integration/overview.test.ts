// The chair's call overview at the server: one statement per call, paged, sorted and filtered
// there, the CSV streamed in batches, and plans that read through indexes at a seeded scale.
import { sql } from "drizzle-orm";
import { PgDialect } from "drizzle-orm/pg-core";
import { describe, expect, it } from "vitest";
import { db, pool } from "@/db/client";
import { callOverviewStatement, getCallOverview, getCallOverviewCsv, OVERVIEW_SORTS, streamCallOverviewCsv, type OverviewRow } from "@/lib/dal/reviews";
import { overviewSortColumns, type OverviewSort } from "@/lib/validation/review";
import { getCallCalibration } from "@/lib/dal/meetings";
import { AppError } from "@/lib/errors";
import { asSessionUser } from "../support/factories";
import { seededCall, type Model } from "./overview-fixtures";
import { createReviewRound } from "./review-fixtures";

interface PlanNode {
  "Node Type": string;
  "Relation Name"?: string;
  "Index Name"?: string;
  Plans?: PlanNode[];
}
const planNodes = (node: PlanNode): PlanNode[] => [node, ...(node.Plans ?? []).flatMap(planNodes)];

const byTitle = (a: Model, b: Model) => (a.title < b.title ? -1 : a.title > b.title ? 1 : 0);

/** Expected order: the sort's value (nulls last either way), then title ascending. */
function expectedOrder(models: Model[], sort: Exclude<OverviewSort, "calibratedMean">, dir: "asc" | "desc"): string[] {
  const key = (m: Model): (number | null)[] =>
    ({
      weightedMean: [m.mean],
      spread: [m.spread],
      reviews: [m.totals.length],
      items: [m.major, m.minor, 0],
      flags: [m.inconsistent],
      requirements: [m.notMet],
      title: [],
    })[sort];
  const sign = dir === "asc" ? 1 : -1;
  return [...models]
    .sort((a, b) => {
      const ka = key(a);
      const kb = key(b);
      for (let i = 0; i < ka.length; i++) {
        const x = ka[i]!;
        const y = kb[i]!;
        if (x === y) continue;
        if (x === null) return 1;
        if (y === null) return -1;
        return (x - y) * sign;
      }
      return sort === "title" ? byTitle(a, b) * sign : byTitle(a, b);
    })
    .map((m) => m.title);
}

describe("the call overview at the server", () => {
  it("pages, sorts and filters in one statement, with the figures of every row as seeded", async () => {
    const { round, chair, models } = await seededCall();
    const all = await getCallOverview(chair, round.board.id, round.call.id, { pageSize: 200 });
    expect(all.total).toBe(31);
    expect(all).toMatchObject({ page: 1, pageSize: 200, sort: "weightedMean", dir: "desc", q: "", flagged: false });
    expect(all.rows.map((r) => r.title)).toEqual(expectedOrder(models, "weightedMean", "desc"));
    // Every row's figures against the model.
    for (const row of all.rows) {
      const m = models.find((x) => x.title === row.title)!;
      expect({
        title: row.title,
        reviews: row.reviews,
        assigned: row.assigned,
        totals: row.totals,
        major: row.openItems.major,
        minor: row.openItems.minor,
        comment: row.openItems.comment,
        inconsistent: row.checks.inconsistent,
        notMet: row.requirementsNotMet,
      }).toEqual({
        title: m.title,
        reviews: m.totals.length,
        assigned: m === models.at(-1) ? 0 : 2,
        totals: m.totals,
        major: m.major,
        minor: m.minor,
        comment: 0,
        inconsistent: m.inconsistent,
        notMet: m.notMet,
      });
      if (m.mean === null) expect(row.weightedMean).toBeNull();
      else expect(row.weightedMean).toBeCloseTo(m.mean, 9);
      if (m.spread === null) expect(row.spread).toBeNull();
      else expect(row.spread).toBeCloseTo(m.spread, 9);
      // The distribution is drawn from the row's own totals on the rubric's 1–5 scale.
      expect(row.distribution.reduce((s, d) => s + d.count, 0)).toBe(m.totals.length);
    }

    // Every sort, both ways, paged by 7: the pages put together give the expected order.
    for (const sort of overviewSortColumns.filter((s) => s !== "calibratedMean"))
      for (const dir of ["asc", "desc"] as const) {
        const titles: string[] = [];
        for (let page = 1; page <= 5; page++) {
          const view = await getCallOverview(chair, round.board.id, round.call.id, { sort, dir, page, pageSize: 7 });
          expect(view.total).toBe(31);
          expect(view.rows.length).toBe(page < 5 ? 7 : 3);
          titles.push(...view.rows.map((r: OverviewRow) => r.title));
        }
        expect({ sort, dir, titles }).toEqual({ sort, dir, titles: expectedOrder(models, sort, dir) });
      }

    // Ranked by calibrated mean: the server's order is the calibration fit's (lib/review/calibration.ts
    // over the whole call), proposals without reviews last, ties by title.
    const calibration = await getCallCalibration(chair, round.board.id, round.call.id);
    const calibrated = new Map(calibration.proposals.map((p) => [p.title, p.calibratedMean]));
    expect(calibrated.size).toBeGreaterThan(3);
    const calibratedTitles: string[] = [];
    for (let page = 1; page <= 5; page++)
      calibratedTitles.push(
        ...(await getCallOverview(chair, round.board.id, round.call.id, { sort: "calibratedMean", dir: "desc", page, pageSize: 7 })).rows.map((r) => r.title),
      );
    const calibratedOf = (m: Model) => calibrated.get(m.title) ?? null;
    const expectedCalibrated = [...models]
      .sort(byTitle)
      .sort((a, b) => {
        const x = calibratedOf(a);
        const y = calibratedOf(b);
        return x === null ? (y === null ? 0 : 1) : y === null ? -1 : y - x;
      })
      .map((m) => m.title);
    expect(calibratedTitles).toEqual(expectedCalibrated);

    // The title filter (case ignored, LIKE's wildcards taken literally) and the flag filter.
    const tens = await getCallOverview(chair, round.board.id, round.call.id, { q: "seeded 1", sort: "title", dir: "asc" });
    expect(tens.rows.map((r) => r.title)).toEqual(models.filter((m) => m.title.startsWith("Seeded 1")).map((m) => m.title));
    expect(tens.total).toBe(10);
    expect((await getCallOverview(chair, round.board.id, round.call.id, { q: "seeded_1" })).total).toBe(0);
    const flagged = await getCallOverview(chair, round.board.id, round.call.id, { flagged: true, pageSize: 5 });
    expect(flagged.total).toBe(models.filter((m) => m.flagged).length);
    const flaggedAll = await getCallOverview(chair, round.board.id, round.call.id, { flagged: true, pageSize: 200 });
    expect(flaggedAll.rows.map((r) => r.title)).toEqual(
      expectedOrder(
        models.filter((m) => m.flagged),
        "weightedMean",
        "desc",
      ),
    );
    // A page past the end is empty but still says how many rows match.
    const beyond = await getCallOverview(chair, round.board.id, round.call.id, { page: 9, pageSize: 10 });
    expect(beyond.rows).toEqual([]);
    expect(beyond.total).toBe(31);
    // Only the chair; a reviewer is refused.
    const refused = await getCallOverview(asSessionUser(round.reviewer), round.board.id, round.call.id).catch((e: unknown) => e);
    expect(refused instanceof AppError ? refused.status : refused).toBe(403);
  });

  it("streams the CSV in batches: header first, rows in title order, the screening notice last; filters apply", async () => {
    const { round, chair, models } = await seededCall();
    const { stream, filename } = await streamCallOverviewCsv(chair, round.board.id, round.call.id, {}, 4);
    expect(filename).toMatch(/-overview\.csv$/);
    const reader = stream.getReader();
    const chunks: string[] = [];
    const decoder = new TextDecoder();
    for (;;) {
      const { value, done } = await reader.read();
      if (done) break;
      chunks.push(decoder.decode(value));
    }
    // Header, eight batches of at most 4 rows (31 rows), the notice.
    expect(chunks).toHaveLength(10);
    expect(chunks[0]).toMatch(/^proposal_id,title,status,version,reviews_submitted,reviewers_assigned,reviewers_target,weighted_mean,sample_std_dev,/);
    expect(chunks.slice(1, 9).map((c) => c.trim().split("\r\n").length)).toEqual([4, 4, 4, 4, 4, 4, 4, 3]);
    expect(chunks[9]).toMatch(/^"Notice: .*screening.*flight/i);
    const lines = chunks.join("").trim().split("\r\n");
    const titles = lines.slice(1, -1).map((l) => l.split(",")[1]);
    expect(titles).toEqual([...models].sort(byTitle).map((m) => m.title));
    // Seeded 06: reviews 1 + 0.5 = 1.5 and 2 + 2·0.25 = 2.5 → mean 2.000, s.d. 0.707; 2 minor open; no flags.
    expect(lines.find((l) => l.includes(",Seeded 06,"))).toMatch(/,Seeded 06,in_review,1,2,2,2,2\.000,0\.707,0,2,0,0,0,0$/);
    // Filtered: the title filter and the flag filter narrow the file the same way as the table.
    const filtered = await getCallOverviewCsv(chair, round.board.id, round.call.id, { q: "Seeded 2", flagged: true });
    const filteredTitles = filtered.csv
      .trim()
      .split("\r\n")
      .slice(1, -1)
      .map((l) => l.split(",")[1]);
    expect(filteredTitles).toEqual(models.filter((m) => m.title.startsWith("Seeded 2") && m.flagged).map((m) => m.title));
  });

  it("reads every table of more than 10,000 rows through an index: each sort both ways, the flag filter, the CSV batches (EXPLAIN, seeded scale)", async () => {
    const round = await createReviewRound();
    const b = round.board.id;
    // 20 calls and 12,000 proposals on one board, the round's call holding 600 of them (5 %,
    // like the largest call of a real board), each with a version, 3 assignments, 2 reviews,
    // 1 review item and 3 check results: 12k–36k rows per table.
    await db().execute(sql`
      insert into calls (board_id, title, opens_at, closes_at)
      select ${b}, 'Scale call ' || g, now() - interval '1 day', now() + interval '30 days' from generate_series(1, 19) g`);
    await db().execute(sql`
      with c as (select id, row_number() over (order by id) as n from calls where board_id = ${b} and id <> ${round.call.id}),
      p as (
        insert into proposals (board_id, call_id, owner_id, title, status, latest_version)
        select ${b}, case when g <= 600 then ${round.call.id} else (select id from c where n = 1 + g % 19) end, ${round.proposer.id},
          'Scale ' || g, 'in_review', 1
        from generate_series(1, 12000) g
        returning id, title
      ),
      v as (
        insert into proposal_versions (proposal_id, board_id, number, title, document, document_key, html_key)
        select id, ${b}, 1, title, '{}'::jsonb, 'scale/' || id, 'scale/' || id || '.html' from p
        returning id, proposal_id
      ),
      cr as (
        insert into check_results (version_id, board_id, block_id, kind, status, claim, result)
        select v.id, ${b}, 'b' || n, 'orbit', case when n = 3 then 'inconsistent' else 'consistent' end, '{}'::jsonb, '{}'::jsonb
        from v cross join generate_series(1, 3) n
      ),
      ri as (
        insert into review_items (board_id, proposal_id, version_id, author_id, severity, title, body, anchor)
        select ${b}, v.proposal_id, v.id, ${round.reviewer2.id}, 'minor', 'Item', 'Body', '{"from":0,"to":1,"quote":"x","prefix":"","suffix":""}'::jsonb from v
      ),
      a as (
        insert into assignments (board_id, proposal_id, version_id, reviewer_id, due_at)
        select ${b}, v.proposal_id, v.id, r, now() from v cross join unnest(array[${round.reviewer.id}::uuid, ${round.reviewer2.id}::uuid, ${round.reviewer3.id}::uuid]) r
        returning id, proposal_id, version_id, reviewer_id
      )
      insert into reviews (assignment_id, board_id, proposal_id, version_id, reviewer_id, rubric_template_id, weighted_total, status)
      select a.id, ${b}, a.proposal_id, a.version_id, a.reviewer_id, (select rubric_template_id from calls where id = ${round.call.id}), 3.5, 'submitted'
      from a where a.reviewer_id <> ${round.reviewer.id}`);
    await db().execute(sql`analyze proposals, proposal_versions, assignments, reviews, review_items, check_results, calls`);
    const sizes = new Map(
      (
        await pool().query<{ relname: string; n: number }>(
          `select relname, reltuples::float8 as n from pg_class where relname in ('proposals','proposal_versions','assignments','reviews','review_items','check_results','calls')`,
        )
      ).rows.map((r) => [r.relname, r.n]),
    );
    // The seeded scale is big enough for the planner to prefer scans if the indexes did not serve.
    for (const big of ["proposals", "proposal_versions", "assignments", "reviews", "review_items", "check_results"])
      expect(sizes.get(big)!).toBeGreaterThan(10_000);
    const dialect = new PgDialect();
    const scansOfBigTables = async (statement: ReturnType<typeof callOverviewStatement>) => {
      const built = dialect.sqlToQuery(statement);
      const { rows } = await pool().query(`explain (format json) ${built.sql}`, built.params);
      return planNodes((rows[0]["QUERY PLAN"] as { Plan: PlanNode }[])[0]!.Plan)
        .filter((n) => n["Node Type"] === "Seq Scan" && (sizes.get(n["Relation Name"] ?? "") ?? 0) > 10_000)
        .map((n) => n["Relation Name"]);
    };
    const cases: { label: string; statement: ReturnType<typeof callOverviewStatement> }[] = [];
    for (const sort of Object.keys(OVERVIEW_SORTS) as OverviewSort[])
      for (const dir of ["asc", "desc"] as const)
        for (const flagged of [false, true])
          cases.push({
            label: `${sort} ${dir}${flagged ? " flagged" : ""}`,
            statement: callOverviewStatement(b, round.call.id, { sort, dir, flagged, limit: 50, offset: 100, withTotal: true }),
          });
    cases.push({
      label: "CSV batch",
      statement: callOverviewStatement(b, round.call.id, {
        sort: "title",
        dir: "asc",
        flagged: false,
        limit: 500,
        after: { title: "Scale 300", id: round.proposal.id },
      }),
    });
    cases.push({
      label: "title filter",
      statement: callOverviewStatement(b, round.call.id, { sort: "weightedMean", dir: "desc", q: "Scale 1", flagged: false, limit: 50 }),
    });
    for (const { label, statement } of cases) expect({ label, scans: await scansOfBigTables(statement) }).toEqual({ label, scans: [] });
    // And the page's answer at this scale: 601 proposals in the call.
    expect((await getCallOverview(asSessionUser(round.chair), b, round.call.id, { pageSize: 10 })).total).toBe(601);
  });
});
