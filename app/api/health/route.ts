import { NextResponse } from "next/server";
import packageJson from "@/package.json";
import { pingDatabase } from "@/lib/dal/health";
import { checkMailTransport } from "@/lib/mail/transport";
import { checkObjectStore } from "@/storage/object-store";

export const dynamic = "force-dynamic";

async function probe(check: () => Promise<unknown>): Promise<string> {
  try {
    await Promise.race([check(), new Promise((_, reject) => setTimeout(() => reject(new Error("no answer within 5 s")), 5_000))]);
    return "ok";
  } catch (error) {
    return error instanceof Error ? error.message : String(error);
  }
}

/** Liveness of the three services the app depends on; 200 when all are ok, 503 otherwise. */
export async function GET() {
  const [database, objectStore, mail] = await Promise.all([probe(pingDatabase), probe(checkObjectStore), probe(checkMailTransport)]);
  const ok = database === "ok" && objectStore === "ok" && mail === "ok";
  return NextResponse.json(
    { status: ok ? "ok" : "degraded", version: packageJson.version, services: { database, objectStore, mail } },
    { status: ok ? 200 : 503, headers: { "Cache-Control": "no-store" } },
  );
}
