"use client";
import { useRouter } from "next/navigation";
import { ActionNotice, CheckboxField, SubmitButton, TextField, useActionForm } from "@/components/ui/form-controls";
import type { BoardView } from "@/lib/dal/boards";
import { updateBoardSettingsAction } from "../actions";

export function SettingsForm({ board }: { board: BoardView }) {
  const router = useRouter();
  const { pending, answer, onSubmit, fieldError } = useActionForm(updateBoardSettingsAction, () => router.refresh());
  return (
    <form onSubmit={onSubmit} className="max-w-2xl space-y-5" aria-label="Board settings">
      <input type="hidden" name="boardId" value={board.id} />
      <ActionNotice answer={answer} success="Settings saved." />
      <TextField label="Board name" name="name" defaultValue={board.name} required minLength={3} maxLength={160} error={fieldError("name")} />
      <TextField label="Description" name="description" defaultValue={board.description} maxLength={2000} error={fieldError("description")} />
      <fieldset className="space-y-4">
        <legend className="mb-2 font-semibold text-ink-900">Who can do what</legend>
        <CheckboxField
          label="Open registration for proposers"
          hint={`Anyone can create an account with the proposer role on this board at /boards/${board.slug}/register.`}
          name="openRegistration"
          defaultChecked={board.openRegistration}
        />
        <CheckboxField
          label="Hide proposers' names from reviewers"
          hint="Reviewers see the dossier without its authors. Reviewers are always hidden from proposers."
          name="hideProposerNames"
          defaultChecked={board.hideProposerNames}
        />
        <CheckboxField
          label="Let reviewers read every submitted version"
          hint="Without this, a reviewer reads only the versions assigned to them, not later revisions."
          name="reviewersSeeAllVersions"
          defaultChecked={board.reviewersSeeAllVersions}
        />
        <CheckboxField
          label="Share review items among reviewers after they submit"
          hint="A reviewer sees the other reviewers' review items on a proposal once their own review is submitted."
          name="shareReviewItemsAfterSubmit"
          defaultChecked={board.shareReviewItemsAfterSubmit}
        />
      </fieldset>
      <SubmitButton pending={pending}>Save settings</SubmitButton>
    </form>
  );
}
