"use client";
import { ActionNotice, SubmitButton, TextField, useActionForm } from "@/components/ui/form-controls";
import { registerProposerAction } from "../actions";

export function RegisterForm({ board }: { board: string }) {
  // The answer is the same whoever owns the address; the next step arrives by e-mail.
  const { pending, answer, onSubmit, fieldError } = useActionForm(registerProposerAction);
  if (answer?.ok) {
    return (
      <p role="status" className="rounded-chip border border-trajectory-200 bg-trajectory-50 p-3 text-ink-800">
        {answer.data.message}
      </p>
    );
  }
  return (
    <form onSubmit={onSubmit} className="space-y-4" aria-label="Register as a proposer" noValidate>
      <input type="hidden" name="board" value={board} />
      <ActionNotice answer={answer} />
      <TextField label="Your name" name="name" autoComplete="name" required maxLength={120} error={fieldError("name")} />
      <TextField label="E-mail" name="email" type="email" autoComplete="email" required error={fieldError("email")} />
      <TextField label="Organisation" hint="Optional." name="organisation" autoComplete="organization" maxLength={160} error={fieldError("organisation")} />
      <TextField
        label="Choose a password"
        hint="At least 12 characters."
        name="password"
        type="password"
        autoComplete="new-password"
        minLength={12}
        required
        error={fieldError("password")}
      />
      <SubmitButton pending={pending}>Register as a proposer</SubmitButton>
    </form>
  );
}
