// The app under test, served from a production build against the test services. Call
// `await appUrl()` in beforeAll of any file that speaks HTTP or drives the browser.
import path from "node:path";
import { ensureApp } from "../../scripts/app-server";
import { serviceConfig } from "../../scripts/service-config";
import { withLock } from "./global-setup";

export async function appUrl(): Promise<string> {
  if (process.env.VISVIVA_TEST_BASE_URL) return process.env.VISVIVA_TEST_BASE_URL;
  const config = serviceConfig("test");
  const url = await withLock(path.join(config.runDir, "app.lock"), () => ensureApp("test"));
  process.env.VISVIVA_TEST_BASE_URL = url;
  return url;
}
