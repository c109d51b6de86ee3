import { NextResponse, type NextRequest } from "next/server";
import { methodTable } from "@/lib/http/allowed-methods";
import { contentSecurityPolicy } from "@/lib/http/csp";
import { crossSiteRefusal } from "@/lib/http/cross-site";
import { NUL_MESSAGE, pathIsMalformed, urlContainsNul } from "@/lib/http/nul";
import { apiOperations } from "@/lib/openapi";

// For /api/v1: a method the path does not allow gets a JSON 405 with an Allow header (Next's
// own 405 has no body). Everything else there is the route handlers' business.
// Two jobs for pages (route handlers answer JSON and check sessions themselves):
// 1. A redirect to /sign-in for pages behind sign-in when there is no session cookie at all;
//    every route handler, action and data read still checks the session and the policy.
// 2. A Content-Security-Policy with a fresh nonce per request. Next.js reads the nonce from
//    the request's policy header and puts it on its own scripts; 'strict-dynamic' lets those
//    load the rest. Dossiers and letters are rendered from stored documents, so the policy is
//    the second line behind the sanitizer: no script the page did not bring can run.
const protectedPrefixes = ["/boards", "/account", "/admin", "/review", "/proposals"];
const apiMethods = methodTable(apiOperations);

/** The object store's origin: uploads go there by presigned PUT, downloads and images by GET. */
function objectStoreOrigin(): string {
  try {
    return process.env.S3_ENDPOINT ? new URL(process.env.S3_ENDPOINT).origin : "";
  } catch {
    return "";
  }
}

export function proxy(request: NextRequest) {
  const { pathname, search } = request.nextUrl;
  // A NUL (U+0000) in a path or filter is refused here, for pages and the API alike.
  // So is a path whose percent-escapes do not decode to text (Next would answer 500).
  const badInput = urlContainsNul(request.url)
    ? NUL_MESSAGE
    : pathIsMalformed(new URL(request.url).pathname)
      ? "The address contains a percent-escape that is not valid UTF-8 text. Check the link."
      : null;
  if (badInput) {
    return pathname.startsWith("/api/")
      ? NextResponse.json({ error: badInput }, { status: 400, headers: { "cache-control": "no-store" } })
      : new NextResponse(badInput, { status: 400, headers: { "content-type": "text/plain; charset=utf-8", "cache-control": "no-store" } });
  }
  if (pathname.startsWith("/api/")) {
    const allowed = apiMethods.allowed(pathname);
    if (allowed && !allowed.includes(request.method)) {
      const use = allowed.filter((m) => m !== "HEAD" && m !== "OPTIONS").join(", ");
      return NextResponse.json(
        { error: `${request.method} is not allowed on ${pathname}; this route answers ${use}. The routes are listed at /api/v1/openapi.json.` },
        { status: 405, headers: { allow: allowed.join(", "), "cache-control": "no-store" } },
      );
    }
    // Cross-site writes: JSON bodies only, and nothing a browser marks as from another origin.
    const refusal = crossSiteRefusal({
      method: request.method,
      pathname,
      headers: request.headers,
      appOrigin: [process.env.APP_URL ?? "", request.nextUrl.origin],
    });
    if (refusal) return NextResponse.json({ error: refusal.error }, { status: refusal.status, headers: { "cache-control": "no-store" } });
    return NextResponse.next();
  }
  const isProtected = protectedPrefixes.some((p) => pathname === p || pathname.startsWith(`${p}/`));
  // Open registration for proposers is for people without an account yet.
  const isRegistration = /^\/boards\/[^/]+\/register\/?$/.test(pathname);
  const hasSession = request.cookies.has("next-auth.session-token") || request.cookies.has("__Secure-next-auth.session-token");
  if (isProtected && !isRegistration && !hasSession) {
    const url = request.nextUrl.clone();
    url.pathname = "/sign-in";
    url.search = `?callbackUrl=${encodeURIComponent(pathname + search)}`;
    return NextResponse.redirect(url);
  }

  const nonce = btoa(crypto.randomUUID());
  const policy = contentSecurityPolicy(nonce, { development: process.env.NODE_ENV === "development", objectStore: objectStoreOrigin() });
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("content-security-policy", policy);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set("content-security-policy", policy);
  return response;
}

export const config = { matcher: ["/((?!api|_next|favicon.ico).*)", "/api/v1/:path*"] };
