import type { Metadata } from "next";
import { NotAllowed, PageTitle } from "@/components/ui/panel";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { listAuditLog } from "@/lib/dal/audit";
import { auditQuerySchema } from "@/lib/validation/accounts";
import { AuditTable } from "./_components/audit-table";

export const metadata: Metadata = { title: "Audit log" };

export default async function AuditPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await pageUser("/admin/audit");
  if (!can(user, "site.admin", { role: null })) return <NotAllowed what="The audit log is for site administrators." />;
  const raw = Object.fromEntries(Object.entries(await searchParams).filter((e): e is [string, string] => typeof e[1] === "string"));
  const parsed = auditQuerySchema.safeParse(raw);
  const query = parsed.success ? parsed.data : auditQuerySchema.parse({});
  const log = await listAuditLog(user, query);
  return (
    <div className="space-y-6">
      <PageTitle eyebrow="Administration" title="Audit log">
        Sign-ins, failed sign-ins, invitations, role changes, deactivations, password changes and board changes.
      </PageTitle>
      <AuditTable rows={log.events} hasMore={log.hasMore} page={log.page} pageSize={log.pageSize} dir={query.dir} search={query.q} />
    </div>
  );
}
