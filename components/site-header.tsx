import Link from "next/link";
import { BrandMark } from "./brand-mark";
import { currentUser } from "@/lib/auth/session";
import { SignOutButton } from "./sign-out-button";

export async function SiteHeader() {
  const user = await currentUser();
  return (
    <header className="border-b border-ink-200 bg-ink-950 text-ink-50">
      <div className="mx-auto flex max-w-7xl items-center gap-6 px-gutter py-3">
        <Link href="/" className="flex items-center gap-2 text-lg font-semibold tracking-tight text-ink-50">
          <BrandMark className="h-7 w-7 text-trajectory-400" />
          VisViva
        </Link>
        <nav aria-label="Main" className="flex flex-1 items-center gap-4 text-sm">
          {user ? (
            <>
              <Link href="/boards" className="hover:text-trajectory-400">
                Boards
              </Link>
              <Link href="/tools/orbit-check" className="hover:text-trajectory-400">
                Orbit check
              </Link>
              {user.isAdmin ? (
                <Link href="/admin/audit" className="hover:text-trajectory-400">
                  Audit log
                </Link>
              ) : null}
              {user.isAdmin ? (
                <Link href="/admin/outbox" className="hover:text-trajectory-400">
                  Outbox
                </Link>
              ) : null}
            </>
          ) : (
            <Link href="/tools/orbit-check" className="hover:text-trajectory-400">
              Orbit check
            </Link>
          )}
        </nav>
        <div className="flex items-center gap-3 text-sm">
          {user ? (
            <>
              <Link href="/account" className="hover:text-trajectory-400">
                {user.name}
              </Link>
              <SignOutButton />
            </>
          ) : (
            <Link href="/sign-in" className="rounded-chip bg-trajectory-600 px-3 py-1.5 font-semibold text-white hover:bg-trajectory-700">
              Sign in
            </Link>
          )}
        </div>
      </div>
    </header>
  );
}
