import NextAuth from "next-auth";
import { NextResponse } from "next/server";
import { authOptions } from "@/lib/auth/options";
import { isMalformedCallbackUrl } from "@/lib/auth/callback-url";

const handler = NextAuth(authOptions);

type Context = { params: Promise<{ nextauth: string[] }> };

const refuse = () =>
  NextResponse.json(
    { error: "The callbackUrl is not a valid address. Use a path on this site, such as /boards." },
    { status: 400, headers: { "cache-control": "no-store" } },
  );

/** next-auth answered 500 to a malformed callbackUrl (issue 17); such requests get a 400 first. */
async function guarded(request: Request, context: Context) {
  const query = new URL(request.url).searchParams.get("callbackUrl");
  if (isMalformedCallbackUrl(query)) return refuse();
  if (request.method === "POST" && (request.headers.get("content-type") ?? "").includes("application/x-www-form-urlencoded")) {
    const form = new URLSearchParams(await request.clone().text());
    if (isMalformedCallbackUrl(form.get("callbackUrl"))) return refuse();
  }
  return handler(request, context);
}

export { guarded as GET, guarded as POST };
