/**
 * Whether a next-auth callbackUrl is malformed: not a URL even relative to this site, or with
 * characters no address carries (controls, NUL, backslash). Absent is fine, and so is an
 * absolute URL elsewhere (next-auth's redirect callback sends those home). Pure.
 */
export function isMalformedCallbackUrl(value: string | null | undefined): boolean {
  if (value === null || value === undefined || value === "") return false;
  if (value.length > 2048) return true;
  if (/[\\\u0000-\u001f\u007f]/.test(value)) return true;
  try {
    new URL(value, "https://visviva.invalid");
    return false;
  } catch {
    return true;
  }
}

/** next-auth's redirect callback: paths on this site and URLs of its origin; anything else goes home. */
export function safeRedirect(url: string, baseUrl: string): string {
  if (isMalformedCallbackUrl(url)) return baseUrl;
  try {
    if (url.startsWith("/") && !url.startsWith("//")) return new URL(url, baseUrl).toString();
    return new URL(url).origin === new URL(baseUrl).origin ? url : baseUrl;
  } catch {
    return baseUrl;
  }
}
