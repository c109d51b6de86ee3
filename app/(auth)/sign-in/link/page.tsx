import type { Metadata } from "next";
import Link from "next/link";
import { LinkSignInButton } from "./_components/link-sign-in-button";

export const metadata: Metadata = { title: "Sign in with your link" };

export default async function SignInLinkPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { token } = await searchParams;
  const valid = typeof token === "string" && token.length >= 10 && token.length <= 200;
  return (
    <div className="mx-auto max-w-md rounded-panel border border-ink-200 bg-white p-6 shadow-panel">
      <h1 className="mb-2 text-xl font-bold text-ink-950">Sign in with your link</h1>
      {valid ? (
        <>
          <p className="mb-4 text-ink-700">Press the button to finish signing in. The link then stops working.</p>
          <LinkSignInButton token={token} />
        </>
      ) : (
        <p role="alert" className="text-void-700">
          This link is incomplete. Copy the whole address from the e-mail, or{" "}
          <Link href="/sign-in" className="underline">
            ask for a new link
          </Link>
          .
        </p>
      )}
    </div>
  );
}
