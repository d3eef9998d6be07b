/**
 * CSRF defence for route handlers (they have none of their own): a mutating request that carries an
 * Origin must come from this host. Browsers always send Origin on cross-site POST/PUT/PATCH/DELETE,
 * so a request without one is not a browser-driven forgery (curl, scripts, server-to-server); those
 * still need a valid session cookie to do anything.
 */
export const MUTATING_METHODS = new Set(["POST", "PUT", "PATCH", "DELETE"]);

export function isSameOrigin(headers: Headers): boolean {
  const origin = headers.get("origin");
  if (origin === null) return headers.get("sec-fetch-site") !== "cross-site";
  if (origin === "null") return false; // sandboxed frames, file:// pages
  let originHost: string;
  try {
    originHost = new URL(origin).host.toLowerCase();
  } catch {
    return false;
  }
  const hosts = [headers.get("host"), headers.get("x-forwarded-host")]
    .flatMap((h) => (h ? h.split(",") : []))
    .map((h) => h.trim().toLowerCase())
    .filter(Boolean);
  return hosts.includes(originHost);
}

/** Best-effort client address for throttling: the nearest hop recorded by the server or proxy. */
export function clientIp(headers: Headers): string {
  const forwarded = headers.get("x-forwarded-for");
  if (forwarded) {
    const hops = forwarded.split(",").map((h) => h.trim()).filter(Boolean);
    const last = hops.at(-1);
    if (last) return last;
  }
  return headers.get("x-real-ip")?.trim() || "unknown";
}
