/**
 * The client's network address from the X-Forwarded-For chain. The app server (scripts/
 * peer-address.cjs, preloaded by every start command) appends the connecting peer's address
 * to the chain, as a proxy does; `trustedHops` proxies in front of it each appended one more.
 * So the client is the entry `trustedHops` places left of the last one: with 0 hops (the
 * default) it is the peer itself, and whatever a client writes into the header is ignored.
 * No framework imports, so it can be unit tested directly.
 */
export function clientAddressFrom(forwardedFor: string | null | undefined, trustedHops: number): string {
  const chain = (forwardedFor ?? "")
    .split(",")
    .map((entry) => entry.trim())
    .filter(Boolean);
  if (chain.length === 0) return "local";
  const hops = Math.max(0, Math.floor(trustedHops));
  // Fewer entries than trusted hops: the nearest proxy did not forward one; take the farthest we have.
  const at = Math.max(0, chain.length - 1 - hops);
  return chain[at]!.slice(0, 100);
}
