"use client";
import { useRouter } from "next/navigation";
import { ActionNotice, SelectField, SubmitButton, TextField, useActionForm } from "@/components/ui/form-controls";
import { inviteMemberAction } from "../actions";

export function InviteForm({ boardId }: { boardId: string }) {
  const router = useRouter();
  const { pending, answer, onSubmit, fieldError } = useActionForm(inviteMemberAction, (_data, form) => {
    form.reset();
    router.refresh();
  });
  return (
    <form onSubmit={onSubmit} className="grid items-end gap-4 md:grid-cols-[1fr_1fr_12rem_auto]" aria-label="Invite a member" noValidate>
      <input type="hidden" name="boardId" value={boardId} />
      <div className="md:col-span-4">
        <ActionNotice answer={answer} success={answer?.ok ? `Invitation sent to ${answer.data.email}. The link works once, for 7 days.` : undefined} />
      </div>
      <TextField label="E-mail" name="email" type="email" required error={fieldError("email")} />
      <TextField label="Name" hint="Optional" name="name" maxLength={120} error={fieldError("name")} />
      <SelectField label="Role" name="role" defaultValue="reviewer" error={fieldError("role")}>
        <option value="proposer">Proposer</option>
        <option value="reviewer">Reviewer</option>
        <option value="chair">Chair</option>
      </SelectField>
      <SubmitButton pending={pending}>Send invitation</SubmitButton>
    </form>
  );
}
