"use client";
import { ActionNotice, FormNotice, SubmitButton, TextField, useActionForm } from "@/components/ui/form-controls";
import { requestPasswordResetAction } from "../actions";

export function PasswordResetRequestForm() {
  const { pending, answer, onSubmit, fieldError } = useActionForm(requestPasswordResetAction);
  return (
    <form aria-label="E-mail me a link to choose a new password" className="space-y-3" onSubmit={onSubmit} noValidate>
      {answer?.ok ? <FormNotice tone="success">{answer.data.message}</FormNotice> : <ActionNotice answer={answer} />}
      <TextField label="Account e-mail" name="email" type="email" autoComplete="email" required error={fieldError("email")} />
      <SubmitButton pending={pending} tone="quiet">
        E-mail me a reset link
      </SubmitButton>
    </form>
  );
}
