import Link from "next/link";

export const metadata = { title: "Not found" };

/** Any page that does not exist, or that the visitor may not see (existence is not revealed). */
export default function NotFound() {
  return (
    <section aria-labelledby="not-found-heading" className="mx-auto max-w-xl rounded-panel border border-ink-200 bg-white p-6 shadow-panel">
      <h1 id="not-found-heading" className="text-xl font-semibold text-ink-900">
        This page is not here
      </h1>
      <p className="mt-2 text-ink-700">
        The address may be mistyped, the item may have been removed, or your account may not have access to it. If someone sent you this link, ask them to check
        it.
      </p>
      <p className="mt-4">
        <Link href="/boards" className="font-semibold text-trajectory-700 underline">
          Go to my boards
        </Link>
      </p>
    </section>
  );
}
