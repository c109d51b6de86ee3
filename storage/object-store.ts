import "server-only";
import { Client, CopyDestinationOptions, CopySourceOptions } from "minio";
import type { Readable } from "node:stream";
import { env } from "@/lib/env";

const globalForStore = globalThis as unknown as { visvivaObjectStore?: Client };

/** The minio client for the configured S3-compatible store (path-style, as s3rver and most stores accept). */
export function objectStore(): Client {
  if (!globalForStore.visvivaObjectStore) {
    const e = env();
    const endpoint = new URL(e.S3_ENDPOINT);
    const useSSL = endpoint.protocol === "https:";
    globalForStore.visvivaObjectStore = new Client({
      endPoint: endpoint.hostname,
      port: endpoint.port ? Number(endpoint.port) : useSSL ? 443 : 80,
      useSSL,
      accessKey: e.S3_ACCESS_KEY,
      secretKey: e.S3_SECRET_KEY,
      region: e.S3_REGION,
      pathStyle: true,
    });
  }
  return globalForStore.visvivaObjectStore;
}

export function bucket(): string {
  return env().S3_BUCKET;
}

/** Short-lived URL the browser PUTs one file to. */
export function presignUpload(objectKey: string, expiresSeconds = 600): Promise<string> {
  return objectStore().presignedPutObject(bucket(), objectKey, expiresSeconds);
}

/**
 * Short-lived URL that downloads an object as an attachment under its original name. The
 * content type is the one the server sniffed (passed in), never what the uploader declared.
 */
export function presignDownload(objectKey: string, filename: string, expiresSeconds = 300, contentType?: string): Promise<string> {
  const safe = filename.replace(/["\\\r\n]/g, "_");
  return objectStore().presignedGetObject(bucket(), objectKey, expiresSeconds, {
    "response-content-disposition": `attachment; filename="${safe}"; filename*=UTF-8''${encodeURIComponent(filename)}`,
    ...(contentType ? { "response-content-type": contentType } : {}),
  });
}

/**
 * Server-side copy of one object to another key, replacing its metadata so the stored
 * Content-Type is `contentType` (never the uploader's PUT header).
 */
export async function copyObject(fromKey: string, toKey: string, contentType: string): Promise<void> {
  await objectStore().copyObject(
    new CopySourceOptions({ Bucket: bucket(), Object: fromKey }),
    new CopyDestinationOptions({ Bucket: bucket(), Object: toKey, MetadataDirective: "REPLACE", Headers: { "Content-Type": contentType } }),
  );
}

export async function statObjectOrNull(objectKey: string): Promise<{ size: number; contentType: string | null } | null> {
  try {
    const stat = await objectStore().statObject(bucket(), objectKey);
    return { size: stat.size, contentType: (stat.metaData?.["content-type"] as string | undefined) ?? null };
  } catch (error) {
    const code = (error as { code?: string }).code;
    if (code === "NotFound" || code === "NoSuchKey") return null;
    throw error;
  }
}

async function streamToBuffer(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk));
  return Buffer.concat(chunks);
}

/** The first `length` bytes of an object, for content sniffing. */
export async function readObjectHead(objectKey: string, length: number): Promise<Buffer> {
  return streamToBuffer(await objectStore().getPartialObject(bucket(), objectKey, 0, length));
}

export async function readObject(objectKey: string): Promise<Buffer> {
  return streamToBuffer(await objectStore().getObject(bucket(), objectKey));
}

export async function readObjectStream(objectKey: string): Promise<Readable> {
  return objectStore().getObject(bucket(), objectKey);
}

export async function writeObject(objectKey: string, body: Buffer | string, contentType: string): Promise<void> {
  const data = typeof body === "string" ? Buffer.from(body, "utf8") : body;
  await objectStore().putObject(bucket(), objectKey, data, data.length, { "Content-Type": contentType });
}

export async function deleteObject(objectKey: string): Promise<void> {
  await objectStore().removeObject(bucket(), objectKey);
}

/** For the health check: the bucket answers. */
export async function checkObjectStore(): Promise<void> {
  const exists = await objectStore().bucketExists(bucket());
  if (!exists) throw new Error(`bucket ${bucket()} does not exist`);
}
