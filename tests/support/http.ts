// A small HTTP client for the running test app that keeps cookies, and signs in through
// next-auth's real credentials flow.
import { TEST_PASSWORD } from "./factories";

export function baseUrl(): string {
  const url = process.env.VISVIVA_TEST_BASE_URL;
  if (!url) throw new Error("The test app is not up: call `await appUrl()` (tests/support/app.ts) in beforeAll");
  return url;
}

export class HttpClient {
  private cookies = new Map<string, string>();

  cookieHeader(): string {
    return [...this.cookies.entries()].map(([k, v]) => `${k}=${v}`).join("; ");
  }

  private keep(response: Response) {
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(";");
      const index = pair!.indexOf("=");
      const name = pair!.slice(0, index).trim();
      const value = pair!.slice(index + 1).trim();
      if (/max-age=0|expires=thu, 01 jan 1970/i.test(line) || value === "") this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  async request(path: string, init: RequestInit & { json?: unknown } = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    if (this.cookies.size) headers.set("cookie", this.cookieHeader());
    let body = init.body;
    if (init.json !== undefined) {
      headers.set("content-type", "application/json");
      body = JSON.stringify(init.json);
    }
    const response = await fetch(`${baseUrl()}${path}`, { ...init, headers, body, redirect: "manual" });
    this.keep(response);
    return response;
  }

  get(path: string) {
    return this.request(path);
  }

  post(path: string, json?: unknown) {
    return this.request(path, { method: "POST", json });
  }

  /** Signs in with a next-auth credentials provider; returns the error message, or null on success. */
  async signIn(provider: "password" | "link", credentials: Record<string, string>, headers: Record<string, string> = {}): Promise<string | null> {
    const csrf = (await (await this.request("/api/auth/csrf")).json()) as { csrfToken: string };
    const form = new URLSearchParams({ ...credentials, csrfToken: csrf.csrfToken, callbackUrl: `${baseUrl()}/boards`, json: "true" });
    const response = await this.request(`/api/auth/callback/${provider}`, {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded", ...headers },
      body: form.toString(),
    });
    const location = response.headers.get("location") ?? ((await response.json().catch(() => ({}))) as { url?: string }).url ?? "";
    const error = new URL(location, baseUrl()).searchParams.get("error");
    return error;
  }

  async signInAs(email: string, password = TEST_PASSWORD): Promise<this> {
    const error = await this.signIn("password", { email, password });
    if (error) throw new Error(`sign-in as ${email} failed: ${error}`);
    return this;
  }
}

export async function signedIn(email: string): Promise<HttpClient> {
  return new HttpClient().signInAs(email);
}
