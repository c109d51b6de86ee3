"use client";
import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { ActionNotice, SubmitButton, TextField, useActionForm } from "@/components/ui/form-controls";
import { registerProposerAction } from "../actions";

export function RegisterForm({ board }: { board: string }) {
  const router = useRouter();
  // After signing in, refresh so the header and server components see the new session.
  const go = (path: string) => {
    router.push(path);
    router.refresh();
  };
  const { pending, answer, onSubmit, fieldError } = useActionForm(registerProposerAction, async (result, form) => {
    const target = `/boards/${result.boardId}`;
    const password = String(new FormData(form).get("password") ?? "");
    const signedIn = await signIn("password", { email: result.email, password, redirect: false, callbackUrl: target });
    go(signedIn?.ok && !signedIn.error ? target : `/sign-in?callbackUrl=${encodeURIComponent(target)}`);
  });
  return (
    <form onSubmit={onSubmit} className="space-y-4" aria-label="Register as a proposer" noValidate>
      <input type="hidden" name="board" value={board} />
      <ActionNotice answer={answer} success="Registered. Signing you in…" />
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
