"use client";
import { ActionNotice, FormNotice, SubmitButton, TextField, useActionForm } from "@/components/ui/form-controls";
import { requestSignInLinkAction } from "../actions";

export function LinkRequestForm() {
  const { pending, answer, onSubmit, fieldError } = useActionForm(requestSignInLinkAction);
  return (
    <form aria-label="E-mail me a sign-in link" className="space-y-4" onSubmit={onSubmit} noValidate>
      {answer?.ok ? <FormNotice tone="success">{answer.data.message}</FormNotice> : <ActionNotice answer={answer} />}
      <TextField label="E-mail" name="email" type="email" autoComplete="email" required error={fieldError("email")} />
      <SubmitButton pending={pending} tone="quiet">
        E-mail me a sign-in link
      </SubmitButton>
    </form>
  );
}
