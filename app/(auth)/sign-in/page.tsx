import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { currentUser } from "@/lib/auth/session";
import { PasswordSignInForm } from "./_components/password-sign-in-form";
import { requestPasswordResetAction, requestSignInLinkAction } from "./actions";
import { EmailRequestForm } from "./_components/email-request-form";
import { safeCallback } from "./_components/safe-callback";

export const metadata: Metadata = { title: "Sign in" };

// next-auth hands errors back in the URL; show our own messages and the known codes only,
// never arbitrary text from a link someone else crafted.
const knownCodes: Record<string, string> = {
  CredentialsSignin: "That e-mail and password do not match an active account.",
  SessionRequired: "Sign in to continue.",
  Default: "Signing in did not work. Try again.",
};
const ownMessages = [
  /^Too many failed sign-in attempts\. Try again in (under a minute|about (a|\d+) (minute|minutes|hours|days))\.$/,
  /^That e-mail and password do not match an active account\.$/,
  /^Enter your e-mail and password\.$/,
  /^This sign-in link is invalid, already used or expired\. Ask for a new one\.$/,
  /^Confirm your e-mail address first: open the link we mailed when you registered\. No mail\? Ask for a sign-in link below; it confirms the address too\.$/,
];

function errorText(error: string | undefined): string | null {
  if (!error) return null;
  if (ownMessages.some((pattern) => pattern.test(error))) return error;
  return knownCodes[error] ?? knownCodes.Default!;
}

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = await searchParams;
  const callbackUrl = safeCallback(typeof params.callbackUrl === "string" ? params.callbackUrl : undefined);
  if (await currentUser()) redirect(callbackUrl);
  return (
    <div className="mx-auto grid max-w-4xl gap-8 md:grid-cols-2">
      <div className="md:col-span-2">
        <h1 className="text-2xl font-bold text-ink-950">Sign in to VisViva</h1>
        <p className="text-ink-700">Use your password, or have a one-time sign-in link sent to your inbox.</p>
      </div>
      <section aria-labelledby="password-heading" className="rounded-panel border border-ink-200 bg-white p-6 shadow-panel">
        <h2 id="password-heading" className="mb-4 text-lg font-semibold">
          With your password
        </h2>
        <PasswordSignInForm callbackUrl={callbackUrl} initialError={errorText(typeof params.error === "string" ? params.error : undefined)} />
        <details className="mt-6 border-t border-ink-100 pt-4">
          <summary className="cursor-pointer text-sm font-semibold text-trajectory-700">Forgot your password?</summary>
          <div className="mt-3">
            <EmailRequestForm
              action={requestPasswordResetAction}
              formLabel="E-mail me a link to choose a new password"
              fieldLabel="Account e-mail"
              buttonLabel="E-mail me a reset link"
            />
          </div>
        </details>
      </section>
      <section aria-labelledby="link-heading" className="rounded-panel border border-ink-200 bg-white p-6 shadow-panel">
        <h2 id="link-heading" className="mb-1 text-lg font-semibold">
          With a link by e-mail
        </h2>
        <p className="mb-4 text-sm text-ink-600">The link works once, for 15 minutes.</p>
        <EmailRequestForm action={requestSignInLinkAction} formLabel="E-mail me a sign-in link" fieldLabel="E-mail" buttonLabel="E-mail me a sign-in link" />
      </section>
    </div>
  );
}
