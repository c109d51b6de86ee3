import { formatDateTime } from "@/lib/format/dates";
import type { Metadata } from "next";
import Link from "next/link";
import { CallForm } from "@/components/dossier/call-form";
import { PageTitle, Panel } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getBoard } from "@/lib/dal/boards";
import { listCalls } from "@/lib/dal/calls";

export const metadata: Metadata = { title: "Calls" };

const STATE_TEXT = { upcoming: "Opens soon", open: "Open", closed: "Closed" } as const;

export default async function CallsPage({ params }: { params: Promise<{ boardId: string }> }) {
  const { boardId } = await params;
  const user = await pageUser(`/boards/${boardId}/calls`);
  const board = await orNotFound(getBoard(user, boardId));
  const calls = await listCalls(user, boardId);
  const isChair = can(user, "call.manage", { role: board.myRole });
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={board.name} title="Calls">
        <p>A call collects dossiers between its opening and closing dates and sets the tolerance the server applies to orbit checks.</p>
      </PageTitle>
      <Panel title="All calls">
        {calls.length === 0 ? (
          <p className="text-ink-600">No calls yet.</p>
        ) : (
          <table className="w-full text-left text-sm">
            <thead className="text-ink-600">
              <tr>
                <th scope="col" className="py-1">
                  Call
                </th>
                <th scope="col">State</th>
                <th scope="col">Opens (UTC)</th>
                <th scope="col">Closes (UTC)</th>
                <th scope="col">Tolerance</th>
              </tr>
            </thead>
            <tbody>
              {calls.map((c) => (
                <tr key={c.id} className="border-t border-ink-100">
                  <td className="py-1.5">
                    <Link href={`/boards/${boardId}/calls/${c.id}`} className="font-semibold text-trajectory-700 hover:underline">
                      {c.title}
                    </Link>
                  </td>
                  <td>{STATE_TEXT[c.state]}</td>
                  <td>{formatDateTime(c.opensAt)}</td>
                  <td>{formatDateTime(c.closesAt)}</td>
                  <td className="font-mono">{(c.tolerance.relative * 100).toFixed(2)} %</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Panel>
      {isChair ? (
        <Panel title="Open a new call">
          <CallForm boardId={boardId} />
        </Panel>
      ) : null}
    </div>
  );
}
