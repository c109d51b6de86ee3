// The bench's baseline: a bare node:http + pg server that answers the proposals list with
// the same SQL the app runs for a chair (default sort, page by offset, one extra row) and
// the same JSON shape. No session, no validation, no framework: the floor the app is held to.
import http from "node:http";
import { Pool } from "pg";

const pool = new Pool({ connectionString: process.env.DATABASE_URL, max: 10 });
const boardId = process.env.BASELINE_BOARD!;
const port = Number(process.env.BASELINE_PORT);

// Same statement as proposalListStatement() in lib/dal/proposals.ts for a chair, sort updatedAt desc.
const LIST_SQL = `select "id", "title", "mission_type", "status", "call_id",
  (select "calls"."title" from "calls" where "calls"."id" = "proposals"."call_id" and "calls"."board_id" = "proposals"."board_id"),
  "latest_version", "owner_id", "created_at", "updated_at", "proposals"."updated_at"::text
  from "proposals" where "proposals"."board_id" = $1
  order by "proposals"."updated_at" desc, "proposals"."id" desc limit $2 offset $3`;

const server = http.createServer((request, response) => {
  const url = new URL(request.url ?? "/", "http://127.0.0.1");
  if (url.pathname === "/health") {
    response.end("ok");
    return;
  }
  const pageSize = Math.min(100, Math.max(1, Number(url.searchParams.get("pageSize") ?? 20) || 20));
  const page = Math.max(1, Number(url.searchParams.get("page") ?? 1) || 1);
  pool
    .query({ text: LIST_SQL, values: [boardId, pageSize + 1, (page - 1) * pageSize], rowMode: "array" })
    .then(({ rows }) => {
      const hasMore = rows.length > pageSize;
      const shown = hasMore ? rows.slice(0, pageSize) : rows;
      const last = shown.at(-1);
      const body = {
        rows: shown.map((r) => ({
          id: r[0],
          title: r[1],
          missionType: r[2],
          status: r[3],
          callId: r[4],
          callTitle: r[5],
          latestVersion: r[6],
          isOwner: false,
          createdAt: (r[8] as Date).toISOString(),
          updatedAt: (r[9] as Date).toISOString(),
        })),
        page,
        pageSize,
        hasMore,
        nextCursor: hasMore && last ? Buffer.from(JSON.stringify({ s: "updatedAt", d: "desc", v: last[10], i: last[0] })).toString("base64url") : null,
      };
      response.writeHead(200, { "content-type": "application/json" });
      response.end(JSON.stringify(body));
    })
    .catch(() => {
      response.writeHead(500);
      response.end();
    });
});

server.listen(port, "127.0.0.1");
process.on("SIGTERM", () => {
  server.close();
  void pool.end().then(() => process.exit(0));
});
