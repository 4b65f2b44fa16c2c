// The address a request came from, for per-address rate limits. Behind a load balancer
// (HB_TRUST_PROXY=1) it is the last X-Forwarded-For entry, the one the balancer itself added;
// served directly it is the socket's address, which scripts/lib/peer-address.mjs (preloaded by
// the start and test scripts) puts in a header the client cannot set. Without either: "unknown",
// so every such client shares one bucket.
import { env } from "../env.server";

export function clientAddress(request: Request): string {
  if (env().HB_TRUST_PROXY === "1") {
    const hops = (request.headers.get("X-Forwarded-For") ?? "").split(",").map((s) => s.trim()).filter(Boolean);
    if (hops.length) return hops[hops.length - 1];
  }
  const header = (globalThis as Record<symbol, unknown>)[Symbol.for("hiltbench.peerAddressHeader")];
  if (typeof header === "string") return request.headers.get(header) || "unknown";
  return "unknown";
}
