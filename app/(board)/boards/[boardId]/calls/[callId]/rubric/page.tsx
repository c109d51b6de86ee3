import type { Metadata } from "next";
import { NotAllowed, PageTitle } from "@/components/ui/panel";
import { formatDateTime } from "@/lib/format/dates";
import { RubricEditor } from "@/components/review/rubric-editor";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/policy";
import { getBoard } from "@/lib/dal/boards";
import { getCallRubric } from "@/lib/dal/rubrics";

export const metadata: Metadata = { title: "Rubric" };

export default async function RubricPage({ params }: { params: Promise<{ boardId: string; callId: string }> }) {
  const { boardId, callId } = await params;
  const user = await pageUser(`/boards/${boardId}/calls/${callId}/rubric`);
  const board = await orNotFound(getBoard(user, boardId));
  if (!can(user, "rubric.manage", { role: board.myRole })) return <NotAllowed what="Only the board's chair edits a call's rubric." />;
  const { call, rubric, history } = await orNotFound(getCallRubric(user, boardId, callId));
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={`${board.name} · ${call.title}`} title="Rubric">
        <p>Reviewers score each criterion on the rubric&apos;s scale; the weighted total is Σ weight × score / 100, on the same scale.</p>
      </PageTitle>
      <RubricEditor boardId={boardId} callId={callId} rubric={rubric} />
      {history.length > 1 ? (
        <section aria-labelledby="history-heading">
          <h2 id="history-heading" className="text-lg font-semibold">
            Versions
          </h2>
          <ul className="text-sm text-ink-700">
            {history.map((h) => (
              <li key={h.id}>
                v{h.version} · {h.name} · created {formatDateTime(h.createdAt)}
                {h.frozenAt ? ` · in use since ${formatDateTime(h.frozenAt)}` : ""}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </div>
  );
}
