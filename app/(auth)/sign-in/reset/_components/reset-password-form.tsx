"use client";
import Link from "next/link";
import { ActionNotice, SubmitButton, TextField, useActionForm } from "@/components/ui/form-controls";
import { resetPasswordAction } from "../actions";

export function ResetPasswordForm({ token }: { token: string }) {
  const { pending, answer, onSubmit, fieldError } = useActionForm(resetPasswordAction);
  if (answer?.ok) {
    return (
      <p className="rounded-panel border border-holds-500 bg-holds-100 p-4 text-holds-700" role="status">
        Your password for {answer.data.email} is changed and every browser is signed out.{" "}
        <Link href="/sign-in" className="font-semibold underline">
          Sign in with the new password
        </Link>
        .
      </p>
    );
  }
  return (
    <form onSubmit={onSubmit} className="space-y-4" aria-label="Choose a new password" noValidate>
      <input type="hidden" name="token" value={token} />
      <ActionNotice answer={answer} />
      <TextField
        label="New password"
        hint="At least 12 characters. A few unrelated words make a good one."
        name="password"
        type="password"
        autoComplete="new-password"
        minLength={12}
        required
        error={fieldError("password")}
      />
      <TextField label="The same again" name="confirmPassword" type="password" autoComplete="new-password" required error={fieldError("confirmPassword")} />
      <SubmitButton pending={pending}>Set the new password</SubmitButton>
    </form>
  );
}
