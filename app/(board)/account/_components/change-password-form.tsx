"use client";
import { ActionNotice, SubmitButton, TextField, useActionForm } from "@/components/ui/form-controls";
import { changePasswordAction } from "../actions";

export function ChangePasswordForm() {
  const { pending, answer, onSubmit, fieldError } = useActionForm(changePasswordAction, (_data, form) => form.reset());
  return (
    <form onSubmit={onSubmit} className="max-w-md space-y-4" aria-label="Change password">
      <ActionNotice
        answer={answer}
        success={
          answer?.ok
            ? `Password changed. ${answer.data.revokedSessions} other browser${answer.data.revokedSessions === 1 ? " was" : "s were"} signed out.`
            : undefined
        }
      />
      <TextField
        label="Current password"
        name="currentPassword"
        type="password"
        autoComplete="current-password"
        required
        error={fieldError("currentPassword")}
      />
      <TextField
        label="New password"
        hint="At least 12 characters. Your other browsers are signed out."
        name="newPassword"
        type="password"
        autoComplete="new-password"
        minLength={12}
        required
        error={fieldError("newPassword")}
      />
      <SubmitButton pending={pending}>Change password</SubmitButton>
    </form>
  );
}
