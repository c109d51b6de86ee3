"use client";
import { useState } from "react";

// Every signed-in page shows this button, so it does not import next-auth/react (about 8 kB
// compressed on every page): it makes the same two requests next-auth's own signOut() makes
// (a CSRF token, then the form POST to /api/auth/signout, whose handler revokes the session
// row) and goes where the answer says. No page uses next-auth's SessionProvider, so there is
// no session state in other tabs to tell.
async function signOutAndLeave(callbackUrl: string): Promise<void> {
  const csrf = (await (await fetch("/api/auth/csrf", { headers: { accept: "application/json" } })).json()) as { csrfToken?: string };
  const response = await fetch("/api/auth/signout", {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ csrfToken: csrf.csrfToken ?? "", callbackUrl, json: "true" }),
  });
  const answer = (await response.json().catch(() => ({}))) as { url?: string };
  window.location.href = answer.url ?? callbackUrl;
}

export function SignOutButton() {
  const [failed, setFailed] = useState(false);
  return (
    <>
      <button
        type="button"
        onClick={() => {
          setFailed(false);
          signOutAndLeave("/").catch(() => setFailed(true));
        }}
        className="rounded-chip border border-ink-600 px-3 py-1 hover:border-trajectory-400"
      >
        Sign out
      </button>
      {failed ? (
        <span role="alert" className="text-xs text-drift-100">
          Signing out failed: the server did not answer. Try again.
        </span>
      ) : null}
    </>
  );
}
