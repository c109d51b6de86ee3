"use client";
import { signOut } from "next-auth/react";

export function SignOutButton() {
  return (
    <button type="button" onClick={() => signOut({ callbackUrl: "/" })} className="rounded-chip border border-ink-600 px-3 py-1 hover:border-trajectory-400">
      Sign out
    </button>
  );
}
