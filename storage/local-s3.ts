// The local S3-compatible stand-in (s3rver) on loopback, for the demo and the tests.
// Production points the same minio client at a real store through S3_ENDPOINT.
import fs from "node:fs";
import S3rver from "s3rver";

const port = Number(process.env.LOCAL_S3_PORT ?? 54321);
const directory = process.env.LOCAL_S3_DIR ?? ".data/demo/s3";
const bucket = process.env.LOCAL_S3_BUCKET ?? "visviva";

// Browsers PUT and GET through presigned URLs from the app's origin.
const cors = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>*</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;

fs.mkdirSync(directory, { recursive: true });

const server = new S3rver({
  port,
  address: "127.0.0.1",
  directory,
  silent: true,
  vhostBuckets: false,
  configureBuckets: [{ name: bucket, configs: [cors] }],
});

// Stored objects are never rendered by the browser as a page of the store's origin: every
// GET answers as a download, and the type is not sniffed. (A real store gets the same from
// the presigned GET's response-content-disposition, and should live on another site.)
type KoaContext = { method: string; status: number; set(name: string, value: string): void; response: { get(name: string): string } };
const middleware = (server as unknown as { middleware: ((ctx: KoaContext, next: () => Promise<void>) => Promise<void>)[] }).middleware;
middleware.unshift(async (ctx, next) => {
  await next();
  if (ctx.method !== "GET" && ctx.method !== "HEAD") return;
  ctx.set("X-Content-Type-Options", "nosniff");
  if (ctx.status >= 200 && ctx.status < 300 && !/^attachment\b/i.test(ctx.response.get("Content-Disposition") ?? "")) {
    ctx.set("Content-Disposition", "attachment");
  }
});

server.run().then(
  () => console.log(`local S3 store on http://127.0.0.1:${port} (bucket ${bucket}, data ${directory})`),
  (error: unknown) => {
    console.error("local S3 store failed to start:", error);
    process.exit(1);
  },
);

for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.on(signal, () => {
    server.close().finally(() => process.exit(0));
  });
}
