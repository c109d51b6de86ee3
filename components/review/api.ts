// The review screens talk to /api/v1 from the browser (autosave needs the status codes and
// the revision in the answer). The server checks the session and the policy on every call.
export type ApiAnswer<T> = { ok: true; status: number; data: T } | { ok: false; status: number; error: string; details?: unknown };

export async function callApi<T>(url: string, init: { method?: string; body?: unknown } = {}): Promise<ApiAnswer<T>> {
  try {
    const response = await fetch(url, {
      method: init.method ?? "GET",
      headers: init.body === undefined ? undefined : { "content-type": "application/json" },
      body: init.body === undefined ? undefined : JSON.stringify(init.body),
      credentials: "same-origin",
    });
    const text = await response.text();
    const parsed = text ? (JSON.parse(text) as unknown) : null;
    if (response.ok) return { ok: true, status: response.status, data: parsed as T };
    const body = (parsed ?? {}) as { error?: string; details?: unknown };
    return { ok: false, status: response.status, error: body.error ?? `The server answered ${response.status}.`, details: body.details };
  } catch {
    return { ok: false, status: 0, error: "The server could not be reached. Your changes are kept on this page; try again." };
  }
}

export const formatScore = (value: number | null | undefined, digits = 2) => (value === null || value === undefined ? "–" : value.toFixed(digits));

// Dates and times: formatDateTime / formatDate from lib/format/dates (one format, UTC, zone shown).
