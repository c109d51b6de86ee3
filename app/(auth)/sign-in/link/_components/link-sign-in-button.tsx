"use client";
import { useState, useTransition } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { FormNotice, SubmitButton } from "@/components/ui/form-controls";

/** The token is spent only on this click, so a mail scanner that opens the link cannot use it up. */
export function LinkSignInButton({ token }: { token: string }) {
  const router = useRouter();
  // After signing in, refresh so the header and server components see the new session.
  const go = (path: string) => {
    router.push(path);
    router.refresh();
  };
  const [error, setError] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  return (
    <form
      className="space-y-4"
      onSubmit={(event) => {
        event.preventDefault();
        startTransition(async () => {
          const result = await signIn("link", { token, redirect: false, callbackUrl: "/boards" });
          if (result?.ok && !result.error) {
            go("/boards");
            return;
          }
          setError(
            result?.error && result.error !== "CredentialsSignin" ? result.error : "This sign-in link is invalid, already used or expired. Ask for a new one.",
          );
        });
      }}
    >
      {error ? (
        <FormNotice tone="error">
          {error}{" "}
          <Link href="/sign-in" className="underline">
            Back to sign-in
          </Link>
        </FormNotice>
      ) : null}
      <SubmitButton pending={pending}>Sign in to VisViva</SubmitButton>
    </form>
  );
}
