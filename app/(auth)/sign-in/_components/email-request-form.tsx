"use client";
// One e-mail field that asks the server to mail a single-use link (sign-in or password reset);
// the server answers the same way whether or not the address has an account.
import { ActionNotice, FormNotice, SubmitButton, TextField, useActionForm, type ActionAnswer } from "@/components/ui/form-controls";

export function EmailRequestForm({
  action,
  formLabel,
  fieldLabel,
  buttonLabel,
}: {
  action: (input: FormData) => Promise<ActionAnswer<{ message: string }>>;
  formLabel: string;
  fieldLabel: string;
  buttonLabel: string;
}) {
  const { pending, answer, onSubmit, fieldError } = useActionForm(action);
  return (
    <form aria-label={formLabel} className="space-y-3" onSubmit={onSubmit} noValidate>
      {answer?.ok ? <FormNotice tone="success">{answer.data.message}</FormNotice> : <ActionNotice answer={answer} />}
      <TextField label={fieldLabel} name="email" type="email" autoComplete="email" required error={fieldError("email")} />
      <SubmitButton pending={pending} tone="quiet">
        {buttonLabel}
      </SubmitButton>
    </form>
  );
}
