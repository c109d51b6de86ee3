// Preloaded (`node --require scripts/peer-address.cjs next start ...`) by every command that
// serves the app. Appends the connecting peer's address to X-Forwarded-For on each request,
// as a proxy would, so lib/http/client-address.ts can trust exactly TRUSTED_PROXY_HOPS
// entries from the right and never the part a client wrote itself.
// eslint-disable-next-line @typescript-eslint/no-require-imports -- a CommonJS preload for node --require
const http = require("node:http");

function appendPeer(req) {
  const peer = req.socket && req.socket.remoteAddress ? String(req.socket.remoteAddress).replace(/^::ffff:/, "") : "";
  if (!peer) return;
  const sent = req.headers["x-forwarded-for"];
  const chain = Array.isArray(sent) ? sent.join(", ") : sent;
  req.headers["x-forwarded-for"] = chain ? `${chain}, ${peer}` : peer;
}

const originalEmit = http.Server.prototype.emit;
http.Server.prototype.emit = function emit(event, req, ...rest) {
  if (event === "request" && req && req.headers && !req.__visvivaPeer) {
    req.__visvivaPeer = true;
    appendPeer(req);
  }
  return originalEmit.call(this, event, req, ...rest);
};

module.exports = { appendPeer };
