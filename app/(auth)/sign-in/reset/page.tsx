import type { Metadata } from "next";
import Link from "next/link";
import { ResetPasswordForm } from "./_components/reset-password-form";

export const metadata: Metadata = { title: "Choose a new password" };

export default async function ResetPasswordPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { token } = await searchParams;
  return (
    <div className="mx-auto max-w-md space-y-4">
      <h1 className="text-2xl font-bold text-ink-950">Choose a new password</h1>
      {typeof token === "string" && token.length > 0 ? (
        <section className="rounded-panel border border-ink-200 bg-white p-6 shadow-panel">
          <ResetPasswordForm token={token} />
        </section>
      ) : (
        <p className="text-ink-700">
          This page needs the link from the reset e-mail.{" "}
          <Link href="/sign-in" className="font-semibold text-trajectory-700 underline">
            Ask for one on the sign-in page
          </Link>
          .
        </p>
      )}
    </div>
  );
}
