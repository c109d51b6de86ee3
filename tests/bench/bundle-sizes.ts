/**
 * First-load JavaScript per page route, read from an existing production build (prints
 * figures; asserts nothing). For each page it takes the build's root main files
 * (build-manifest.json `rootMainFiles`: the framework and runtime every page loads) and the
 * union of the `entryJSFiles` the route's client reference manifest
 * (server/app/<route>/page_client-reference-manifest.js) lists for its layouts, error and
 * not-found boundaries and the page itself: the scripts the page's HTML loads before it is
 * interactive. Chunks loaded later through next/dynamic or import() are not counted. The
 * polyfill chunk is left out (it is `nomodule`: current browsers never fetch it). Each file
 * is sized gzip-compressed at zlib's default level, as the Next server sends it.
 *
 * The chunks of the page's next/dynamic components (server/app/<route>/page/
 * react-loadable-manifest.json) are printed beside it as "+ deferred": they are fetched only
 * when such a component renders (the dossier editor for people who may edit, the letter
 * editor, the orbit-check console...), in parallel with the page when it renders on the server.
 */
import fs from "node:fs";
import path from "node:path";
import vm from "node:vm";
import zlib from "node:zlib";

export interface RouteSize {
  route: string;
  files: string[];
  gzipBytes: number;
  rawBytes: number;
  goalBytes: number;
  /** Chunks of the page's next/dynamic components (react-loadable-manifest.json), beyond the first load. */
  deferredGzipBytes: number;
}

/** Issue 19's goals: the dossier page at most 300 kB compressed, every other page 180 kB. */
export const DOSSIER_ROUTE = "/boards/[boardId]/proposals/[proposalId]";
export const goalFor = (route: string) => (route === DOSSIER_ROUTE ? 300_000 : 180_000);

function walk(dir: string, found: string[]) {
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) walk(full, found);
    else if (entry.name === "page_client-reference-manifest.js") found.push(full);
  }
}

/** The build folder to read: `--dist <dir>`, else `.next` (npm run build), else `.next-test` (the tests' build). */
export function findBuild(root: string, argv = process.argv): string | null {
  const i = argv.indexOf("--dist");
  const candidates = i >= 0 && argv[i + 1] ? [argv[i + 1]!] : [".next", ".next-test"];
  for (const c of candidates) {
    const dir = path.resolve(root, c);
    if (fs.existsSync(path.join(dir, "BUILD_ID")) && fs.existsSync(path.join(dir, "build-manifest.json"))) return dir;
  }
  return null;
}

export function routeSizes(distDir: string): RouteSize[] {
  const buildManifest = JSON.parse(fs.readFileSync(path.join(distDir, "build-manifest.json"), "utf8")) as { rootMainFiles?: string[] };
  const rootMain = buildManifest.rootMainFiles ?? [];
  const gzipCache = new Map<string, { gz: number; raw: number }>();
  const sizeOf = (file: string) => {
    let size = gzipCache.get(file);
    if (!size) {
      const bytes = fs.readFileSync(path.join(distDir, file));
      size = { gz: zlib.gzipSync(bytes).length, raw: bytes.length };
      gzipCache.set(file, size);
    }
    return size;
  };
  const manifests: string[] = [];
  walk(path.join(distDir, "server", "app"), manifests);
  const sizes: RouteSize[] = [];
  for (const file of manifests) {
    // The manifest is a script that assigns globalThis.__RSC_MANIFEST[<page>]; run it in an empty context.
    const context: { globalThis?: unknown; __RSC_MANIFEST?: Record<string, { entryJSFiles?: Record<string, string[]> }> } = {};
    context.globalThis = context;
    vm.runInNewContext(fs.readFileSync(file, "utf8"), context, { timeout: 2000 });
    for (const [page, manifest] of Object.entries(context.__RSC_MANIFEST ?? {})) {
      const route =
        page
          .replace(/\/page$/, "")
          .split("/")
          .filter((s) => s && !/^\(.*\)$/.test(s))
          .map((s) => `/${s}`)
          .join("") || "/";
      if (route.startsWith("/_")) continue;
      const files = new Set(rootMain);
      for (const list of Object.values(manifest.entryJSFiles ?? {})) for (const f of list) files.add(f.replace(/^\/?_next\//, ""));
      let gz = 0;
      let raw = 0;
      for (const f of files) {
        const s = sizeOf(f);
        gz += s.gz;
        raw += s.raw;
      }
      let deferred = 0;
      const loadable = path.join(path.dirname(file), "page", "react-loadable-manifest.json");
      if (fs.existsSync(loadable)) {
        const entries = JSON.parse(fs.readFileSync(loadable, "utf8")) as Record<string, { files?: string[] }>;
        const later = new Set<string>();
        for (const entry of Object.values(entries)) for (const f of entry.files ?? []) if (f.endsWith(".js") && !files.has(f)) later.add(f);
        for (const f of later) deferred += sizeOf(f).gz;
      }
      sizes.push({ route, files: [...files], gzipBytes: gz, rawBytes: raw, goalBytes: goalFor(route), deferredGzipBytes: deferred });
    }
  }
  return sizes.sort((a, b) => a.route.localeCompare(b.route));
}

const kB = (n: number) => `${(n / 1000).toFixed(1)} kB`;

/** Prints one line per page route with its goal; says how to make a build when there is none. */
export function benchBundles(root: string): void {
  console.log("");
  console.log("First-load JavaScript per page, gzip-compressed as sent (issue 19 goals: dossier ≤ 300 kB, others ≤ 180 kB)");
  const dist = findBuild(root);
  if (!dist) {
    console.log("  no production build found: run `nice -n 10 npm run build` (writes .next), or pass --dist <folder>.");
    return;
  }
  const built = fs.statSync(path.join(dist, "BUILD_ID")).mtime;
  console.log(`  read from ${path.relative(root, dist) || "."} (built ${built.toISOString().slice(0, 16).replace("T", " ")} UTC)`);
  const sizes = routeSizes(dist);
  let over = 0;
  for (const s of sizes) {
    const met = s.gzipBytes <= s.goalBytes;
    if (!met) over++;
    console.log(
      `  ${s.route.padEnd(58)}${kB(s.gzipBytes).padStart(10)}  (${kB(s.rawBytes).padStart(9)} raw)  goal ≤ ${kB(s.goalBytes).padStart(8)} → ${met ? "met" : "NOT met"}` +
        (s.deferredGzipBytes > 0 ? `   + ${kB(s.deferredGzipBytes)} deferred (next/dynamic, when used)` : ""),
    );
  }
  console.log(`  ${sizes.length} pages, ${over === 0 ? "all within their goal" : `${over} over their goal`}`);
  console.log("  (deferred: chunks fetched only when a next/dynamic component renders; not part of the first load)");
}
