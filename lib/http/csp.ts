/**
 * The Content-Security-Policy of every page (set by proxy.ts with a fresh nonce per request).
 * No framework imports, so it is unit tested directly.
 */
export function contentSecurityPolicy(nonce: string, options: { development?: boolean; objectStore?: string } = {}): string {
  const store = options.objectStore ? ` ${options.objectStore}` : "";
  return [
    "default-src 'self'",
    // Next's dev server evaluates modules with eval(); production builds never do.
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${options.development ? " 'unsafe-eval'" : ""}`,
    // React writes style attributes (plot sizes, progress widths); no stylesheet comes from elsewhere.
    "style-src 'self' 'unsafe-inline'",
    `img-src 'self' data: blob:${store}`,
    "font-src 'self' data:",
    `connect-src 'self'${store}`,
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}
