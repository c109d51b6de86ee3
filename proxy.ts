import { NextResponse, type NextRequest } from "next/server";

// Only a redirect for pages behind sign-in when there is no session cookie at all; every
// route handler, action and data read still checks the session and the policy itself.
const protectedPrefixes = ["/boards", "/account", "/admin", "/review", "/proposals"];

export function proxy(request: NextRequest) {
  const { pathname, search } = request.nextUrl;
  if (!protectedPrefixes.some((p) => pathname === p || pathname.startsWith(`${p}/`))) return NextResponse.next();
  // Open registration for proposers is for people without an account yet.
  if (/^\/boards\/[^/]+\/register\/?$/.test(pathname)) return NextResponse.next();
  const hasSession = request.cookies.has("next-auth.session-token") || request.cookies.has("__Secure-next-auth.session-token");
  if (hasSession) return NextResponse.next();
  const url = request.nextUrl.clone();
  url.pathname = "/sign-in";
  url.search = `?callbackUrl=${encodeURIComponent(pathname + search)}`;
  return NextResponse.redirect(url);
}

export const config = { matcher: ["/((?!api|_next|favicon.ico).*)"] };
