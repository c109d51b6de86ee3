/**
 * Only a path on this site is followed after sign-in: an absolute URL to another origin is
 * reduced to its path, and sign-in pages fall back to the boards list.
 */
export function safeCallback(value: string | undefined | null, fallback = "/boards"): string {
  if (!value) return fallback;
  try {
    const url = new URL(value, "http://visviva.invalid");
    const path = `${url.pathname}${url.search}${url.hash}`;
    return path.startsWith("/") && !path.startsWith("//") && !path.startsWith("/sign-in") ? path : fallback;
  } catch {
    return fallback;
  }
}
