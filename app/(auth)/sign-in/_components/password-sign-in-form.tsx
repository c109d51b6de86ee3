"use client";
import { useState, useTransition } from "react";
import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { FormNotice, SubmitButton, TextField } from "@/components/ui/form-controls";

export function PasswordSignInForm({ callbackUrl, initialError }: { callbackUrl: string; initialError: string | null }) {
  const router = useRouter();
  // After signing in, refresh so the header and server components see the new session.
  const go = (path: string) => {
    router.push(path);
    router.refresh();
  };
  const [error, setError] = useState<string | null>(initialError);
  const [pending, startTransition] = useTransition();
  return (
    <form
      aria-label="Sign in with e-mail and password"
      className="space-y-4"
      onSubmit={(event) => {
        event.preventDefault();
        const data = new FormData(event.currentTarget);
        startTransition(async () => {
          const result = await signIn("password", {
            email: String(data.get("email") ?? ""),
            password: String(data.get("password") ?? ""),
            redirect: false,
            callbackUrl,
          });
          if (result?.ok && !result.error) {
            go(callbackUrl);
            return;
          }
          setError(result?.error && result.error !== "CredentialsSignin" ? result.error : "That e-mail and password do not match an active account.");
        });
      }}
    >
      {error ? <FormNotice tone="error">{error}</FormNotice> : null}
      <TextField label="E-mail" name="email" type="email" autoComplete="username" required />
      <TextField label="Password" name="password" type="password" autoComplete="current-password" required />
      <SubmitButton pending={pending}>Sign in</SubmitButton>
    </form>
  );
}
