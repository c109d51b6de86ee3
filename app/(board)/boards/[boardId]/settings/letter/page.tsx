import type { Metadata } from "next";
import { NotAllowed, PageTitle, Panel } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { getLetterTemplate } from "@/lib/decisions";
import { isAppError } from "@/lib/errors";
import { TemplateForm } from "./_components/template-form";

export const metadata: Metadata = { title: "Decision letter template" };

export default async function LetterTemplatePage({ params }: { params: Promise<{ boardId: string }> }) {
  const { boardId } = await params;
  const user = await pageUser(`/boards/${boardId}/settings/letter`);
  const t = await orNotFound(getLetterTemplate(user, boardId)).catch((error: unknown) => {
    if (isAppError(error) && error.status === 403) return null;
    throw error;
  });
  if (!t) return <NotAllowed what="The decision letter template is kept by the board's chair." />;
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={`${t.boardName} · Settings`} title="Decision letter template">
        Every decision starts from this letter; the chair edits it per proposal before sending. Merge fields in double braces are filled in from the proposal,
        the reviews and the decision.
      </PageTitle>
      <Panel title={t.isDefault ? "VisViva's default letter" : "This board's letter"}>
        <TemplateForm
          boardId={boardId}
          template={t.template}
          fields={t.mergeFields.map((f) => ({ name: f.name, description: f.description }))}
          isDefault={t.isDefault}
        />
      </Panel>
    </div>
  );
}
