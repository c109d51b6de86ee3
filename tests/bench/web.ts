/**
 * `npm run bench:web` — web figures at a board's scale. It prints figures; it is not a test.
 *
 *  1. Creates its own database (visviva_bench) on the test PostgreSQL (started if it is not
 *     up), applies the migrations and fills one board through generate_series: 20 calls,
 *     100,000 proposals × scale, a submitted version for four in five, four check results (some
 *     with requirement outcomes), three or four assignments per version (300,000 at scale 1),
 *     a review for five assignments in six (250,000, four rubric scores each: 1 million), about
 *     1.1 review items per version (88,000); the first call holds 4.5 % of the proposals (the
 *     overview's call, as the 4,495 of 100,000). Each call has a four-criterion rubric.
 *  2. Starts the built app (.next-test; build it first with a test that calls appUrl(), or
 *     `NEXT_DIST_DIR=.next-test npx next build`) against that database, and a bare
 *     node:http + pg server (tests/bench/web-baseline.ts) running the same list SQL.
 *  3. Prints p50/p95 for the list's first and middle pages (by page and by cursor), the call
 *     overview API (first page, default sort; and sorted by title), the overview page (HTML),
 *     the whole CSV (streamed), the orbit-check API (200 claims), and the list's first page
 *     while a chair loads the overview over and over; then req/s at 1, 8 and 32 connections
 *     (autocannon) for the app's and the baseline's first page, with their ratio.
 *
 * Options: --scale 0.1 (quick run), --seconds 5 (per autocannon run), --samples 30,
 * --fill-only (make and fill the database, print its sizes, stop: no build needed),
 * --keep-data (measure again on the database the last run filled).
 * Every run is bounded in time; everything started here is stopped on exit.
 */
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { hash as argon2Hash } from "@node-rs/argon2";
import autocannon from "autocannon";
import { Client } from "pg";
import { runMigrations } from "../../db/migrate";
import { appEnvironment, serviceConfig } from "../../scripts/service-config";
import { portAnswers, recreateDatabase, startOneService, stopServices } from "../../scripts/services";

function option(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  if (i < 0) return fallback;
  const value = Number(process.argv[i + 1]);
  if (!Number.isFinite(value) || value <= 0) throw new Error(`--${name} needs a positive number`);
  return value;
}

const scale = option("scale", 1);
const seconds = option("seconds", 5);
const samples = Math.round(option("samples", 30));
const PROPOSALS = Math.max(100, Math.round(100_000 * scale));
const CALLS = 20;
const PASSWORD = "bench-password-not-secret";
const BENCH_DB = "visviva_bench";

const root = path.resolve(__dirname, "../..");
const config = serviceConfig("test");
const started: ChildProcess[] = [];
let startedPostgres = false;

const log = (s: string) => console.log(s);
const ms = (n: number) => `${n.toFixed(1)} ms`;

async function waitFor(url: string, timeoutMs: number) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    try {
      const r = await fetch(url, { signal: AbortSignal.timeout(2000) });
      if (r.status < 500) return;
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
}

async function fill(url: string) {
  const client = new Client({ connectionString: url });
  await client.connect();
  try {
    const t0 = performance.now();
    // lib/auth/passwords.ts is server-only; an argon2id hash carries its own cost, so the app verifies this one.
    const hash = await argon2Hash(PASSWORD);
    await client.query("begin");
    const {
      rows: [chair],
    } = await client.query(`insert into users (email, name, password_hash) values ('chair@bench.example.org', 'Bench Chair', $1) returning id`, [hash]);
    const {
      rows: [board],
    } = await client.query(`insert into boards (slug, name) values ('bench-board', 'Bench Board') returning id`);
    await client.query(`insert into board_members (board_id, user_id, role) values ($1, $2, 'chair')`, [board.id, chair.id]);
    // 500 proposers and 60 reviewers, without passwords (nobody signs in as them).
    await client.query(`insert into users (email, name) select 'proposer' || g || '@bench.example.org', 'Proposer ' || g from generate_series(1, 500) g`);
    await client.query(`insert into users (email, name) select 'reviewer' || g || '@bench.example.org', 'Reviewer ' || g from generate_series(1, 60) g`);
    await client.query(
      `insert into board_members (board_id, user_id, role)
       select $1, id, case when email like 'proposer%' then 'proposer' else 'reviewer' end from users where email like '%@bench.example.org' and id <> $2`,
      [board.id, chair.id],
    );
    await client.query(
      `insert into calls (board_id, title, opens_at, closes_at)
       select $1, 'Bench call ' || lpad(g::text, 2, '0'), now() - interval '60 days', now() + (g - 10) * interval '1 day' from generate_series(1, $2::int) g`,
      [board.id, CALLS],
    );
    // The largest call takes about 4.5 % of the proposals (4,495 of 100,000 in the copy).
    await client.query(
      `with c as (select id, row_number() over (order by title) - 1 as k from calls where board_id = $1),
            p as (select id, row_number() over (order by email) - 1 as k from users where email like 'proposer%@bench.example.org')
       insert into proposals (board_id, call_id, owner_id, title, mission_type, status, latest_version, created_at, updated_at)
       select $1, (select id from c where c.k = case when g % 1000 < 45 then 0 else 1 + g % ($3::int - 1) end),
              (select id from p where p.k = g % 500), 'Mission ' || g, (array['science','relay','imaging','demo'])[1 + g % 4],
              case when g % 5 = 0 then 'draft' when g % 5 = 1 then 'submitted' when g % 5 = 2 then 'in_review' else 'decided' end,
              case when g % 5 = 0 then 0 else 1 end,
              now() - g * interval '17 seconds', now() - g * interval '13 seconds' - (g % 7) * interval '1 microsecond'
       from generate_series(1, $2::int) g`,
      [board.id, PROPOSALS, CALLS],
    );
    await client.query(
      `insert into proposal_versions (proposal_id, board_id, number, title, document, document_key, html_key, submitted_by, submitted_at)
       select id, board_id, 1, title, '{"type":"doc","content":[]}'::jsonb, 'bench/' || id || '/1.json', 'bench/' || id || '/1.html', owner_id, updated_at
       from proposals where board_id = $1 and latest_version = 1`,
      [board.id],
    );
    // Four check results per version (the copy: 315,000 for 80,000 versions); one in ten
    // carries a requirement the claim does not meet.
    await client.query(
      `insert into check_results (version_id, board_id, block_id, kind, status, claim, result, requirements)
       select v.id, v.board_id, 'b' || k, 'orbit', (array['consistent','consistent','inconsistent','invalid'])[1 + (k + abs(hashtext(v.id::text))) % 4],
              '{"kind":"orbit"}'::jsonb, '{}'::jsonb,
              case when (k + abs(hashtext(v.id::text))) % 10 = 0 then '[{"requirementId":"r1","status":"notMet"},{"requirementId":"r2","status":"met"}]'::jsonb
                   else '[]'::jsonb end
       from proposal_versions v, generate_series(1, 4) k where v.board_id = $1`,
      [board.id],
    );
    // Three assignments per version, a fourth for three versions in four (300,000 at scale 1).
    await client.query(
      `with r as (select id, row_number() over (order by email) - 1 as k from users where email like 'reviewer%@bench.example.org')
       insert into assignments (board_id, proposal_id, version_id, reviewer_id, due_at)
       select v.board_id, v.proposal_id, v.id, r.id, now() + interval '14 days'
       from (select v.*, abs(hashtext(v.id::text)) as h from proposal_versions v where v.board_id = $1) v
       cross join generate_series(0, 3) j join r on r.k = (v.h + j * 7) % 60
       where j < 3 or v.h % 4 <> 0`,
      [board.id],
    );
    // A four-criterion rubric per call (weights 40/30/20/10, scale 1–5).
    await client.query(
      `with t as (
         insert into rubric_templates (board_id, call_id, version, name, criteria, frozen_at)
         select $1, c.id, 1, 'Bench rubric', (
           select jsonb_agg(jsonb_build_object('id', 'c' || n, 'title', 'Criterion ' || n, 'description', '', 'weight', w, 'scaleMin', 1, 'scaleMax', 5,
                  'levels', '["Poor","Weak","Fair","Good","Strong"]'::jsonb, 'commentRequiredBelow', null) order by n)
           from (values (1, 40), (2, 30), (3, 20), (4, 10)) as x(n, w)), now()
         from calls c where c.board_id = $1
         returning id, call_id
       )
       update calls set rubric_template_id = t.id from t where calls.id = t.call_id`,
      [board.id],
    );
    // A review for five assignments in six (250,000 at scale 1), four scores each (1 million);
    // four in five submitted with their weighted total, the rest drafts.
    await client.query(
      `insert into reviews (assignment_id, board_id, proposal_id, version_id, reviewer_id, rubric_template_id, scores, summary, weighted_total, status, submitted_at)
       select a.id, a.board_id, a.proposal_id, a.version_id, a.reviewer_id, c.rubric_template_id,
              jsonb_build_object('c1', jsonb_build_object('score', s1, 'comment', ''), 'c2', jsonb_build_object('score', s2, 'comment', ''),
                                 'c3', jsonb_build_object('score', s3, 'comment', ''), 'c4', jsonb_build_object('score', s4, 'comment', '')),
              'Bench review.', (40 * s1 + 30 * s2 + 20 * s3 + 10 * s4) / 100.0,
              case when h % 5 = 0 then 'draft' else 'submitted' end, case when h % 5 = 0 then null else now() end
       from (select a.*, abs(hashtext(a.id::text)) as h from assignments a where a.board_id = $1) a
       join proposals p on p.id = a.proposal_id
       join calls c on c.id = p.call_id
       cross join lateral (select 1 + h % 5 as s1, 1 + (h / 5) % 5 as s2, 1 + (h / 25) % 5 as s3, 1 + (h / 125) % 5 as s4) s
       where h % 6 <> 0`,
      [board.id],
    );
    // About 1.1 review items per version (88,000 at scale 1): one each, a second for one in nine;
    // severities mixed, one in three resolved.
    await client.query(
      `insert into review_items (board_id, proposal_id, version_id, author_id, severity, title, body, anchor, status)
       select v.board_id, v.proposal_id, v.id, a.reviewer_id, (array['major','minor','minor','comment'])[1 + (v.h + j) % 4],
              'Bench item', 'The claim needs its source.', '{"from":0,"to":1,"quote":"x","prefix":"","suffix":""}'::jsonb,
              case when (v.h + j) % 3 = 0 then 'resolved' else 'open' end
       from (select v.*, abs(hashtext(v.id::text)) as h from proposal_versions v where v.board_id = $1) v
       cross join generate_series(0, 1) j
       cross join lateral (select reviewer_id from assignments a where a.version_id = v.id limit 1) a
       where j = 0 or v.h % 9 = 0`,
      [board.id],
    );
    await client.query("commit");
    // As autovacuum would in time: statistics, and the visibility map for index-only scans.
    await client.query("vacuum analyze");
    const counts = await client.query(
      `select (select count(*) from proposals) p, (select count(*) from proposal_versions) v, (select count(*) from check_results) c, (select count(*) from assignments) a,
              (select count(*) from reviews) r, (select count(*) from review_items) i`,
    );
    // The overview is measured on the first call: 4.5 % of the proposals, as the 4,495 of 100,000.
    const big = await client.query(
      `select p.call_id, count(*)::int n from proposals p join calls c on c.id = p.call_id where p.board_id = $1 and c.title = 'Bench call 01' group by p.call_id`,
      [board.id],
    );
    const c = counts.rows[0];
    log(
      `filled in ${((performance.now() - t0) / 1000).toFixed(1)} s: ${c.p} proposals, ${c.v} versions, ${c.c} check results, ${c.a} assignments, ` +
        `${c.r} reviews (${Number(c.r) * 4} rubric scores), ${c.i} review items`,
    );
    log(`the overview's call: ${big.rows[0].n} proposals (the other 19 share the rest)`);
    const middle = await client.query(`select updated_at::text v, id from proposals where board_id = $1 order by updated_at desc, id desc offset $2 limit 1`, [
      board.id,
      Math.floor(PROPOSALS / 2) - 1,
    ]);
    return { boardId: board.id as string, largestCallId: big.rows[0].call_id as string, middle: middle.rows[0] as { v: string; id: string } };
  } finally {
    await client.end();
  }
}

async function signIn(base: string): Promise<string> {
  const jar = new Map<string, string>();
  const keep = (r: Response) => {
    for (const line of r.headers.getSetCookie()) {
      const [pair] = line.split(";");
      const i = pair!.indexOf("=");
      jar.set(pair!.slice(0, i).trim(), pair!.slice(i + 1).trim());
    }
  };
  const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
  const csrfResponse = await fetch(`${base}/api/auth/csrf`);
  keep(csrfResponse);
  const { csrfToken } = (await csrfResponse.json()) as { csrfToken: string };
  const form = new URLSearchParams({ email: "chair@bench.example.org", password: PASSWORD, csrfToken, callbackUrl: `${base}/boards`, json: "true" });
  const r = await fetch(`${base}/api/auth/callback/password`, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: cookie() },
    body: form.toString(),
    redirect: "manual",
  });
  keep(r);
  if (![...jar.keys()].some((k) => k.includes("session-token"))) throw new Error(`sign-in to the bench app failed (HTTP ${r.status})`);
  return cookie();
}

const EARTH = "earth";
const templates = [
  { kind: "orbit", body: EARTH, given: { altitude: 500 }, claimed: { period: 5677 } },
  { kind: "hohmann", body: EARTH, given: { initialAltitude: 300, finalAltitude: 35786 }, claimed: { deltaVTotal: 3.89 } },
  { kind: "sunSynchronous", body: EARTH, given: { altitude: 700 }, claimed: { inclination: 98.2 } },
  { kind: "rocket", given: { specificImpulse: 300, initialMass: 2000, finalMass: 1000 }, claimed: { deltaV: "2.04" } },
  { kind: "orbit", body: EARTH, given: { altitude: 500 }, claimed: { period: "94.6" } },
];
const orbitRequest = JSON.stringify({ claims: Array.from({ length: 200 }, (_, i) => ({ id: `c${i + 1}`, ...templates[i % templates.length] })) });

async function latency(label: string, url: string, init: RequestInit, minMs = 0): Promise<{ p50: number; p95: number }> {
  const times: number[] = [];
  const started = Date.now();
  const deadline = started + 60_000;
  let status = 0;
  for (let i = 0; (i < samples + 3 || Date.now() - started < minMs) && Date.now() < deadline; i++) {
    const t0 = performance.now();
    const r = await fetch(url, { ...init, signal: AbortSignal.timeout(30_000) });
    await r.arrayBuffer();
    status = r.status;
    if (i >= 3) times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  const at = (q: number) => times[Math.min(times.length - 1, Math.floor(times.length * q))]!;
  log(`  ${label.padEnd(48)} p50 ${ms(at(0.5)).padStart(10)}  p95 ${ms(at(0.95)).padStart(10)}  (${times.length} requests, HTTP ${status})`);
  return { p50: at(0.5), p95: at(0.95) };
}

/** Requests each of `targets` in turn, one at a time, until `stop()` is called; answers how many completed. */
function keepLoading(targets: { url: string; init: RequestInit }[]): { stop: () => Promise<number> } {
  let running = true;
  let done = 0;
  const loop = (async () => {
    for (let i = 0; running; i++) {
      const { url, init } = targets[i % targets.length]!;
      try {
        const r = await fetch(url, { ...init, signal: AbortSignal.timeout(30_000) });
        await r.arrayBuffer();
        done += 1;
      } catch {
        // counted as not done
      }
    }
  })();
  return {
    stop: async () => {
      running = false;
      await loop;
      return done;
    },
  };
}

async function throughput(url: string, headers: Record<string, string>, connections: number): Promise<number> {
  const result = await autocannon({ url, headers, connections, duration: seconds, timeout: 20 });
  if (result.non2xx > 0 || result.errors > 0) log(`    (${result.non2xx} non-2xx, ${result.errors} errors at ${connections} connections)`);
  return result.requests.average;
}

function stopAll() {
  for (const child of started) if (child.pid && child.exitCode === null) child.kill("SIGTERM");
  if (startedPostgres) stopServices("test", "postgres");
}

const fillOnly = process.argv.includes("--fill-only");
// Measure again on the database a previous run filled (its fill time was printed then).
const keepData = process.argv.includes("--keep-data");

async function existing(url: string) {
  const client = new Client({ connectionString: url });
  await client.connect();
  try {
    const board = await client.query(`select id from boards where slug = 'bench-board'`);
    if (!board.rows[0]) throw new Error("--keep-data: no bench board in visviva_bench; run once without it.");
    const boardId = board.rows[0].id as string;
    const big = await client.query(`select id from calls where board_id = $1 and title = 'Bench call 01'`, [boardId]);
    const n = await client.query(`select count(*)::int n from proposals where board_id = $1`, [boardId]);
    const middle = await client.query(`select updated_at::text v, id from proposals where board_id = $1 order by updated_at desc, id desc offset $2 limit 1`, [
      boardId,
      Math.floor(n.rows[0].n / 2) - 1,
    ]);
    log(`reusing visviva_bench: ${n.rows[0].n} proposals`);
    return { boardId, largestCallId: big.rows[0].id as string, middle: middle.rows[0] as { v: string; id: string } };
  } finally {
    await client.end();
  }
}

async function main() {
  const buildId = path.join(root, ".next-test", "BUILD_ID");
  if (!fillOnly && !fs.existsSync(buildId))
    throw new Error("No build in .next-test: build it first (NEXT_DIST_DIR=.next-test npx next build, or run an HTTP test once).");
  if (!(await portAnswers(config.postgres.port))) {
    await startOneService("test", "postgres");
    startedPostgres = true;
  }
  const env = appEnvironment(config);
  const adminUrl = env.DATABASE_URL!;
  const benchUrl = adminUrl.replace(/\/[^/]+$/, `/${BENCH_DB}`);
  if (!keepData) {
    await recreateDatabase("test", BENCH_DB);
    log(`scale ${scale}: ${PROPOSALS} proposals in one board, ${CALLS} calls`);
  }
  // With --keep-data this brings the kept database up to the current migrations.
  await runMigrations(benchUrl);
  const { boardId, largestCallId, middle } = keepData ? await existing(benchUrl) : await fill(benchUrl);
  if (fillOnly) return;

  const appPort = config.app.port + 50;
  const basePort = config.app.port + 51;
  const app = spawn(process.execPath, [require.resolve("next/dist/bin/next"), "start", "--hostname", "127.0.0.1", "--port", String(appPort)], {
    cwd: root,
    env: { ...process.env, ...env, DATABASE_URL: benchUrl, NEXT_DIST_DIR: ".next-test", NODE_ENV: "production" },
    stdio: ["ignore", "ignore", "inherit"],
  });
  started.push(app);
  const baseline = spawn(process.execPath, [require.resolve("tsx/cli"), path.join(__dirname, "web-baseline.ts")], {
    cwd: root,
    env: { ...process.env, DATABASE_URL: benchUrl, BASELINE_PORT: String(basePort), BASELINE_BOARD: boardId },
    stdio: ["ignore", "ignore", "inherit"],
  });
  started.push(baseline);
  const appBase = `http://127.0.0.1:${appPort}`;
  const baseBase = `http://127.0.0.1:${basePort}`;
  await waitFor(`${appBase}/api/health`, 90_000);
  await waitFor(`${baseBase}/health`, 30_000);
  const cookie = await signIn(appBase);
  const headers = { cookie, accept: "application/json" };

  const list = `${appBase}/api/v1/boards/${boardId}/proposals`;
  const middlePage = Math.floor(PROPOSALS / 2 / 20);
  const cursor = Buffer.from(JSON.stringify({ s: "updatedAt", d: "desc", v: middle.v, i: middle.id }), "utf8").toString("base64url");
  log("");
  log(`Latency, one request at a time (${samples} after 3 warm-up)`);
  await latency("list, first page (app)", `${list}?pageSize=20`, { headers });
  await latency(`list, middle page ${middlePage} by page (app)`, `${list}?pageSize=20&page=${middlePage}`, { headers });
  await latency("list, middle page by cursor (app)", `${list}?pageSize=20&cursor=${cursor}`, { headers });
  await latency("list, first page (baseline)", `${baseBase}/proposals?pageSize=20`, {});
  const overviewApi = `${appBase}/api/v1/boards/${boardId}/calls/${largestCallId}/overview`;
  await latency("overview API, 4.5 % call, first page (app)", overviewApi, { headers });
  await latency("overview API, sorted by title, page 40 (app)", `${overviewApi}?sort=title&dir=asc&page=40`, { headers });
  await latency("overview page, HTML (app)", `${appBase}/boards/${boardId}/calls/${largestCallId}/overview`, { headers: { cookie, accept: "text/html" } });
  await latency("overview CSV, whole call, streamed (app)", `${overviewApi}/csv`, { headers: { cookie, accept: "text/csv" } });
  await latency("orbit-check API, 200 claims (app)", `${appBase}/api/v1/orbit-checks`, {
    method: "POST",
    // An API client, not a browser: no Origin header (the cross-site guard refuses a foreign one).
    headers: { ...headers, "content-type": "application/json" },
    body: orbitRequest,
  });

  // A chair loading the overview again and again (API and page in turn) while the list is measured.
  const chair = keepLoading([
    { url: overviewApi, init: { headers } },
    { url: `${appBase}/boards/${boardId}/calls/${largestCallId}/overview`, init: { headers: { cookie, accept: "text/html" } } },
  ]);
  // Sampled for at least 20 s so that the list's requests overlap many of the chair's loads.
  await latency("list, first page, while a chair loads the overview", `${list}?pageSize=20`, { headers }, 20_000);
  log(`    (the chair's overview loads meanwhile, API and page in turn: ${await chair.stop()})`);

  log("");
  log(`Throughput, list first page, ${seconds} s per run (autocannon)`);
  log(`  ${"connections".padEnd(12)} ${"app req/s".padStart(10)} ${"baseline req/s".padStart(15)} ${"app / baseline".padStart(15)}`);
  for (const connections of [1, 8, 32]) {
    const a = await throughput(`${list}?pageSize=20`, headers, connections);
    const b = await throughput(`${baseBase}/proposals?pageSize=20`, {}, connections);
    log(`  ${String(connections).padEnd(12)} ${a.toFixed(1).padStart(10)} ${b.toFixed(1).padStart(15)} ${(b > 0 ? a / b : 0).toFixed(2).padStart(15)}`);
  }
}

const hardStop = setTimeout(() => {
  console.error("bench:web ran past its time bound; stopping.");
  stopAll();
  process.exit(1);
}, 20 * 60_000).unref();

main()
  .then(() => {
    clearTimeout(hardStop);
    stopAll();
    process.exit(0);
  })
  .catch((error: unknown) => {
    console.error(error instanceof Error ? error.message : error);
    stopAll();
    process.exit(1);
  });
