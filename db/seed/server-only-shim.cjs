// Maps the "server-only" marker to its empty module when the demo seed runs under plain
// Node (tsx), outside Next.js: the data-access layer imports the marker, which throws
// anywhere but in a server bundle. Loaded by db/seed/index.ts before the layer is.
/* eslint-disable @typescript-eslint/no-require-imports -- a CommonJS preload by design */
const Module = require("node:module");
const path = require("node:path");

if (!globalThis.__visvivaServerOnlyShim) {
  globalThis.__visvivaServerOnlyShim = true;
  const empty = path.join(path.dirname(require.resolve("server-only")), "empty.js");
  const resolve = Module._resolveFilename;
  Module._resolveFilename = function resolveServerOnly(request, ...rest) {
    if (request === "server-only") return empty;
    return resolve.call(this, request, ...rest);
  };
}
