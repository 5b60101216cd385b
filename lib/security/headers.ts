// The page Content-Security-Policy (built per request around a nonce, as Next's own CSP guide
// describes), applied by proxy.ts, and the cross-site write check of every API route
// (lib/auth/with-role.ts). The headers every answer carries are in next.config.mjs.

/**
 * Scripts run only with this request's nonce ('strict-dynamic' lets Next's own chunks load theirs);
 * styles allow inline attributes (React `style={…}`) but no other origin; nothing may frame a page.
 */
export function pageContentSecurityPolicy(nonce: string, { dev = false } = {}): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self' data:",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

/**
 * A state-changing request from another site: its Origin (or, failing that, Sec-Fetch-Site) names a
 * site other than the one it was sent to. Requests without either header (curl, scripts) pass:
 * they carry no ambient browser cookies from a visited page.
 */
export function isCrossSiteWrite(req: { method: string; headers: Headers; host: string }): boolean {
  if (["GET", "HEAD", "OPTIONS"].includes(req.method)) return false;
  const origin = req.headers.get("origin");
  if (origin && origin !== "null") {
    try {
      return new URL(origin).host !== req.host;
    } catch {
      return true;
    }
  }
  if (origin === "null") return true;
  const site = req.headers.get("sec-fetch-site");
  return site === "cross-site";
}
