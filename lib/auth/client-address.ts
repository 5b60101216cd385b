import "server-only";

/**
 * The caller's network address for the per-address sign-in limit.
 *
 * `next start` writes the socket's address into X-Forwarded-For only when the request has none,
 * and a route handler cannot see the socket, so the header is all there is. Behind a front door
 * (HAProxy `option forwardfor`, nginx `$proxy_add_x_forwarded_for`) the proxy APPENDS the address
 * it saw, so the entries a client sends can only stand to the left of it. With `TRUSTED_PROXY`
 * set (comma-separated addresses of the front door and any proxies behind it), the address is the
 * rightmost entry that is not a trusted proxy — the one our own front door wrote — whatever the
 * client put in the header. Without it, there is no front door: the app server must listen where
 * only its users' machines reach it, and the rightmost entry (Next's socket address when the client
 * sent no header) is used. Either way the per-account limit holds regardless of the header.
 */
export function clientAddress(
  headers: Record<string, unknown> | undefined,
  trustedProxies = parseTrustedProxies(process.env.TRUSTED_PROXY),
): string {
  const raw = headers?.["x-forwarded-for"];
  const chain = (Array.isArray(raw) ? raw.join(",") : typeof raw === "string" ? raw : "")
    .split(",")
    .map((a) => normalise(a.trim()))
    .filter(Boolean);
  for (let i = chain.length - 1; i >= 0; i--) {
    if (!trustedProxies.has(chain[i])) return chain[i];
  }
  return chain[0] ?? "unknown";
}

export function parseTrustedProxies(setting: string | undefined): Set<string> {
  return new Set(
    (setting ?? "")
      .split(",")
      .map((a) => normalise(a.trim()))
      .filter(Boolean),
  );
}

/** "::ffff:127.0.0.1" and "127.0.0.1" are one address. */
function normalise(address: string): string {
  return address.replace(/^::ffff:(\d+\.\d+\.\d+\.\d+)$/i, "$1").toLowerCase();
}
