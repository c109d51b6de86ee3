"use client";
import { useRouter } from "next/navigation";
import { ActionNotice, SubmitButton, TextField, useActionForm } from "@/components/ui/form-controls";
import { createBoardAction } from "../actions";

export function CreateBoardForm() {
  const router = useRouter();
  const { pending, answer, onSubmit, fieldError } = useActionForm(createBoardAction, (board) => router.push(`/boards/${board.id}/members`));
  return (
    <form onSubmit={onSubmit} className="grid gap-4 md:grid-cols-2" aria-label="Create a board">
      <div className="md:col-span-2">
        <ActionNotice answer={answer} />
      </div>
      <TextField label="Board name" name="name" required minLength={3} maxLength={160} error={fieldError("name")} />
      <TextField
        label="Short name"
        hint="Optional; used in links. Lower-case letters, digits and hyphens."
        name="slug"
        pattern="[a-z0-9]+(-[a-z0-9]+)*"
        maxLength={60}
        error={fieldError("slug")}
      />
      <div className="md:col-span-2">
        <TextField
          label="Description"
          hint="Optional; shown on the board and its registration page."
          name="description"
          maxLength={2000}
          error={fieldError("description")}
        />
      </div>
      <div>
        <SubmitButton pending={pending}>Create board</SubmitButton>
      </div>
    </form>
  );
}
