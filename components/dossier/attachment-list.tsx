// The files a submitted version lists, with their SHA-256, as downloads.
export function AttachmentList({ attachments }: { attachments: { filename: string; size: number; sha256: string; contentPath: string }[] }) {
  return (
    <section aria-labelledby="version-attachments-heading" className="rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
      <h2 id="version-attachments-heading" className="text-base font-semibold text-ink-900">
        Attachments
      </h2>
      {attachments.length === 0 ? (
        <p className="text-sm text-ink-600">None.</p>
      ) : (
        <ul className="mt-2 space-y-1 text-sm">
          {attachments.map((a) => (
            <li key={a.contentPath}>
              <a href={a.contentPath} className="text-trajectory-700 hover:underline">
                {a.filename}
              </a>
              <span className="block truncate font-mono text-2xs text-ink-500" title={a.sha256}>
                SHA-256 {a.sha256.slice(0, 16)}…
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
