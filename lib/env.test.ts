import { describe, expect, it } from "vitest";
import { mailCatcherUrlFor, parseEnv, REQUIRED_VARIABLES } from "./env";

const complete = {
  DATABASE_URL: "postgres://u:p@127.0.0.1:5432/db",
  S3_ENDPOINT: "http://127.0.0.1:9000",
  S3_ACCESS_KEY: "key",
  S3_SECRET_KEY: "secret",
  S3_BUCKET: "visviva",
  SMTP_URL: "smtp://127.0.0.1:2525",
  APP_URL: "https://visviva.example.org",
  NEXTAUTH_SECRET: "a-secret-of-enough-length",
};

describe("issue 17 settings", () => {
  it("serves the caught-mail pages only in demo and test mode, even when a catcher URL is set", () => {
    const url = "http://127.0.0.1:54323";
    expect(mailCatcherUrlFor(parseEnv({ ...complete, MAIL_CATCHER_URL: url }))).toBeNull();
    expect(mailCatcherUrlFor(parseEnv({ ...complete, MAIL_CATCHER_URL: url, VISVIVA_MODE: "demo" }))).toBe(url);
    expect(mailCatcherUrlFor(parseEnv({ ...complete, MAIL_CATCHER_URL: url, VISVIVA_MODE: "test" }))).toBe(url);
    expect(mailCatcherUrlFor(parseEnv({ ...complete, VISVIVA_MODE: "demo" }))).toBeNull();
  });

  it("trusts no proxy hops unless told", () => {
    expect(parseEnv(complete).TRUSTED_PROXY_HOPS).toBe(0);
    expect(parseEnv({ ...complete, TRUSTED_PROXY_HOPS: "2" }).TRUSTED_PROXY_HOPS).toBe(2);
  });
});

describe("parseEnv", () => {
  it("accepts a complete production environment and fills defaults", () => {
    const env = parseEnv(complete);
    expect(env.VISVIVA_MODE).toBe("production");
    expect(env.UPLOAD_MAX_BYTES).toBe(100 * 1024 * 1024);
    expect(env.MAIL_CATCHER_URL).toBeUndefined();
  });

  it("lists every missing required variable at once", () => {
    expect(() => parseEnv({})).toThrow(REQUIRED_VARIABLES.join(", "));
    const rest: Record<string, string | undefined> = { ...complete, SMTP_URL: undefined, S3_BUCKET: undefined };
    expect(() => parseEnv(rest)).toThrow("missing environment variables: S3_BUCKET, SMTP_URL");
  });

  it("names the variable that is malformed", () => {
    expect(() => parseEnv({ ...complete, SMTP_URL: "http://mail" })).toThrow(/SMTP_URL: must start with smtp/);
    expect(() => parseEnv({ ...complete, VISVIVA_MODE: "staging" })).toThrow(/VISVIVA_MODE/);
  });
});
