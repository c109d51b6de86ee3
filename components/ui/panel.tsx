import type { ReactNode } from "react";

/** A titled section of a page; areas add their own panels to shared pages this way. */
export function Panel({
  title,
  description,
  actions,
  children,
  id,
}: {
  title: string;
  description?: ReactNode;
  actions?: ReactNode;
  children: ReactNode;
  id?: string;
}) {
  const headingId = id ? `${id}-heading` : undefined;
  return (
    <section aria-labelledby={headingId} id={id} className="rounded-panel border border-ink-200 bg-white p-5 shadow-panel">
      <div className="mb-4 flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 id={headingId} className="text-lg font-semibold text-ink-900">
            {title}
          </h2>
          {description ? <p className="text-sm text-ink-600">{description}</p> : null}
        </div>
        {actions}
      </div>
      {children}
    </section>
  );
}

export function PageTitle({ eyebrow, title, children }: { eyebrow?: string; title: string; children?: ReactNode }) {
  return (
    <div className="mb-6 space-y-1">
      {eyebrow ? <p className="text-sm font-semibold uppercase tracking-widest text-trajectory-600">{eyebrow}</p> : null}
      <h1 className="text-2xl font-bold text-ink-950">{title}</h1>
      {children ? <div className="text-ink-700">{children}</div> : null}
    </div>
  );
}

/** Shown when a signed-in member opens a page their role does not allow (the server refuses the data too). */
export function NotAllowed({ what }: { what: string }) {
  return (
    <div role="alert" className="rounded-panel border border-drift-500/40 bg-drift-100 p-5 text-drift-700">
      <h1 className="text-lg font-semibold">Not available to your role</h1>
      <p className="mt-1">{what}</p>
    </div>
  );
}
