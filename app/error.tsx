"use client";

import Link from "next/link";

/** A page that failed on the server: say so plainly, offer a retry, never show the error's text. */
export default function PageError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <section role="alert" aria-labelledby="page-error-heading" className="mx-auto max-w-xl rounded-panel border border-void-500/50 bg-white p-6 shadow-panel">
      <h1 id="page-error-heading" className="text-xl font-semibold text-ink-900">
        This page could not be shown
      </h1>
      <p className="mt-2 text-ink-700">
        Something went wrong on our side while preparing it. Nothing you saved is lost. Try again; if it keeps failing, tell your board&apos;s administrator
        {error.digest ? ` and quote the reference ${error.digest}` : ""}.
      </p>
      <div className="mt-4 flex flex-wrap gap-3">
        <button type="button" onClick={reset} className="rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white hover:bg-trajectory-700">
          Try again
        </button>
        <Link href="/boards" className="rounded-chip border border-ink-300 bg-white px-4 py-2 font-semibold text-ink-800 hover:border-trajectory-500">
          Go to my boards
        </Link>
      </div>
    </section>
  );
}
