import type { Metadata } from "next";
import Link from "next/link";
import { z } from "zod";
import { NotAllowed, PageTitle } from "@/components/ui/panel";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { listOutbox } from "@/lib/dal/outbox";
import { OutboxTable } from "./_components/outbox-table";

export const metadata: Metadata = { title: "Outbox" };

const pageQuery = z.object({
  status: z.enum(["queued", "sending", "sent", "failed"]).optional().catch(undefined),
  page: z.coerce.number().int().min(1).max(100_000).catch(1).default(1),
  pageSize: z.coerce.number().int().min(10).max(200).catch(50).default(50),
});

export default async function OutboxPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await pageUser("/admin/outbox");
  if (!can(user, "site.admin", { role: null })) return <NotAllowed what="The outbox is for site administrators." />;
  const raw = Object.fromEntries(Object.entries(await searchParams).filter((e): e is [string, string] => typeof e[1] === "string"));
  const q = pageQuery.parse(raw);
  const data = await listOutbox(user, { status: q.status, limit: q.pageSize, offset: (q.page - 1) * q.pageSize });
  // Counts stop at data.countLimit (an index range each, never a count of the whole outbox).
  const shown = (n: number) => (n >= data.countLimit ? `${data.countLimit} or more` : String(n));
  const filters: [string, string | undefined, number | null][] = [
    ["All", undefined, null],
    ["Queued", "queued", data.counts.queued],
    ["Sending", "sending", data.counts.sending],
    ["Sent", "sent", data.counts.sent],
    ["Failed", "failed", data.counts.failed],
  ];
  return (
    <div className="space-y-6">
      <PageTitle eyebrow="Administration" title="Outbox">
        Every e-mail VisViva sends waits here until the mail server accepts it. Failed messages (refused, or still failing after 12 attempts) can be sent again.
      </PageTitle>
      <nav aria-label="Filter by status" className="flex flex-wrap gap-2 text-sm">
        {filters.map(([label, status, n]) => (
          <Link
            key={label}
            href={status ? `/admin/outbox?status=${status}` : "/admin/outbox"}
            aria-current={q.status === status ? "page" : undefined}
            className="rounded-chip border border-ink-200 px-3 py-1 aria-[current=page]:border-trajectory-500 aria-[current=page]:bg-trajectory-100"
          >
            {n === null ? label : `${label} (${shown(n)})`}
          </Link>
        ))}
      </nav>
      <OutboxTable rows={data.rows} hasMore={data.hasMore} page={q.page} pageSize={q.pageSize} />
    </div>
  );
}
