// Seeded overview rounds for the integration and browser tests: a review round plus 30
// proposals whose reviews, items, checks and requirement outcomes follow a simple model.
import { sql } from "drizzle-orm";
import { db } from "@/db/client";
import { asSessionUser } from "../support/factories";
import { createReviewRound } from "./review-fixtures";

/** What the seeded proposal number g holds (the model the server's answers are checked against). */
export function seeded(g: number) {
  const totals: number[] = [];
  if (g % 10 !== 0) totals.push(1 + (g % 5) * 0.5);
  if (g % 3 === 0) totals.push(2 + (g % 4) * 0.25);
  const mean = totals.length ? totals.reduce((a, b) => a + b, 0) / totals.length : null;
  const spread = totals.length > 1 ? Math.sqrt(totals.reduce((s, t) => s + (t - mean!) ** 2, 0) / (totals.length - 1)) : null;
  const major = g % 4 === 0 ? 1 : 0;
  const minor = g % 6 === 0 ? 2 : 0;
  const inconsistent = g % 7 === 0 ? 1 : 0;
  const notMet = g % 9 === 0 ? 1 : 0;
  return {
    title: `Seeded ${String(g).padStart(2, "0")}`,
    totals: [...totals].sort((a, b) => a - b),
    mean,
    spread,
    major,
    minor,
    inconsistent,
    notMet,
    flagged: major + inconsistent + notMet > 0,
  };
}
export type Model = ReturnType<typeof seeded>;

/** A review round plus 30 proposals with reviews, items, checks and requirement outcomes made in SQL. */
export async function seededCall() {
  const round = await createReviewRound();
  const chair = asSessionUser(round.chair);
  const b = round.board.id;
  await db().execute(sql`
    with p as (
      insert into proposals (board_id, call_id, owner_id, title, status, latest_version)
      select ${b}, ${round.call.id}, ${round.proposer.id}, 'Seeded ' || lpad(g::text, 2, '0'), 'in_review', 1 from generate_series(1, 30) g
      returning id, title
    )
    insert into proposal_versions (proposal_id, board_id, number, title, document, document_key, html_key)
    select id, ${b}, 1, title, '{}'::jsonb, 'seed/' || id, 'seed/' || id || '.html' from p`);
  const versions = sql`(select v.id, v.proposal_id, substring(v.title from 8)::int as g from proposal_versions v
      join proposals p on p.id = v.proposal_id where p.call_id = ${round.call.id} and p.title like 'Seeded %')`;
  const template = sql`(select rubric_template_id from calls where id = ${round.call.id})`;
  // Two assignments per proposal (reviewer 2 and 3); reviewer 2 submits unless g % 10 = 0, reviewer 3 when g % 3 = 0.
  for (const [reviewer, when, total] of [
    [round.reviewer2.id, sql`g % 10 <> 0`, sql`1 + (g % 5) * 0.5`],
    [round.reviewer3.id, sql`g % 3 = 0`, sql`2 + (g % 4) * 0.25`],
  ] as const) {
    await db().execute(sql`
      with a as (
        insert into assignments (board_id, proposal_id, version_id, reviewer_id, due_at)
        select ${b}, s.proposal_id, s.id, ${reviewer}, now() + interval '14 days' from ${versions} s
        returning id, proposal_id, version_id
      )
      insert into reviews (assignment_id, board_id, proposal_id, version_id, reviewer_id, rubric_template_id, weighted_total, status, submitted_at)
      select a.id, ${b}, a.proposal_id, a.version_id, ${reviewer}, ${template}, ${total}, 'submitted', now()
      from a join ${versions} s on s.id = a.version_id where ${when}`);
  }
  await db().execute(sql`
    insert into review_items (board_id, proposal_id, version_id, author_id, severity, title, body, anchor, status)
    select ${b}, s.proposal_id, s.id, ${round.reviewer2.id}, sev, 'Seeded item', 'Body', '{"from":0,"to":1,"quote":"x","prefix":"","suffix":""}'::jsonb, st
    from ${versions} s
    cross join lateral (values ('major', 'open', s.g % 4 = 0), ('minor', 'open', s.g % 6 = 0), ('minor', 'open', s.g % 6 = 0), ('comment', 'resolved', true)) as x(sev, st, keep)
    where keep`);
  await db().execute(sql`
    insert into check_results (version_id, board_id, block_id, kind, status, claim, result, requirements)
    select s.id, ${b}, 'block-' || n, 'orbit', case when n = 1 and s.g % 7 = 0 then 'inconsistent' else 'consistent' end, '{}'::jsonb, '{}'::jsonb,
      case when n = 2 and s.g % 9 = 0 then '[{"status":"notMet"},{"status":"met"}]'::jsonb else '[{"status":"met"}]'::jsonb end
    from ${versions} s cross join generate_series(1, 2) n`);
  const models = Array.from({ length: 30 }, (_, i) => seeded(i + 1));
  // The round's own proposal: no reviews, one inconsistent check (createProposalWithVersion).
  const own: Model = {
    title: round.proposal.title,
    totals: [],
    mean: null,
    spread: null,
    major: 0,
    minor: 0,
    inconsistent: 1,
    notMet: 0,
    flagged: true,
  };
  return { round, chair, models: [...models, own] };
}
