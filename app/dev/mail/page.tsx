import { notFound } from "next/navigation";
import { listCaughtMessages } from "@/lib/mail/catcher-client";
import { formatDateTime } from "@/lib/format/dates";

export const dynamic = "force-dynamic";
export const metadata = { title: "Caught mail" };

function formatBytes(n: number): string {
  if (n >= 1024 * 1024) return `${(n / 1024 / 1024).toFixed(1)} MB`;
  if (n >= 1024) return `${Math.round(n / 1024)} KB`;
  return `${n} bytes`;
}

export default async function CaughtMailPage() {
  const messages = await listCaughtMessages().catch(() => null);
  if (messages === null) notFound();
  return (
    <div className="space-y-4">
      <h1 className="text-2xl font-semibold">Caught mail</h1>
      <p className="text-sm text-ink-600">
        Every message the local mail catcher received ({messages.length}). This page exists only in the demo and test modes (<code>VISVIVA_MODE=demo</code> or{" "}
        <code>test</code>) with a local mail catcher; in production it answers 404.
      </p>
      {messages.length === 0 ? <p className="text-ink-500">No mail yet.</p> : null}
      <ol className="space-y-3">
        {[...messages].reverse().map((m) => (
          <li key={m.id} className="rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
            <details>
              <summary className="cursor-pointer">
                <span className="font-semibold">{m.subject || "(no subject)"}</span>
                <span className="ml-2 text-sm text-ink-600">to {m.to.join(", ")}</span>
                <span className="ml-2 text-xs text-ink-500">{formatDateTime(m.receivedAt)}</span>
              </summary>
              <dl className="mt-3 grid grid-cols-[8rem_1fr] gap-1 text-sm">
                <dt className="text-ink-500">From</dt>
                <dd>{m.from}</dd>
                <dt className="text-ink-500">To</dt>
                <dd>{m.to.join(", ")}</dd>
                <dt className="text-ink-500">Attachments</dt>
                <dd>
                  {m.attachments.length ? (
                    <ul aria-label={`Attachments of ${m.subject || "this message"}`}>
                      {m.attachments.map((a, i) => (
                        <li key={i}>
                          <a href={a.url} download={a.filename ?? undefined} className="text-trajectory-700 underline">
                            {a.filename ?? `Attachment ${i + 1}`}
                          </a>{" "}
                          <span className="text-ink-500">
                            ({a.contentType}, {formatBytes(a.size)})
                          </span>
                        </li>
                      ))}
                    </ul>
                  ) : (
                    "none"
                  )}
                </dd>
              </dl>
              <pre className="mt-3 whitespace-pre-wrap rounded-chip bg-ink-50 p-3 font-mono text-xs">{m.text}</pre>
              {m.html ? (
                <iframe
                  title={`HTML body of ${m.subject}`}
                  sandbox=""
                  srcDoc={m.html}
                  className="mt-3 h-80 w-full rounded-chip border border-ink-200 bg-white"
                />
              ) : null}
            </details>
          </li>
        ))}
      </ol>
    </div>
  );
}
