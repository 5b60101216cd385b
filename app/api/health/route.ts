/**
 * The load balancer's health check: cheap, no session, no database (a database outage answers 503
 * on every real route already; taking every app server out of the pool would only hide that).
 * It says which process answered, so a round-robin front door can be seen working.
 */
export function GET() {
  return Response.json({ ok: true, pid: process.pid }, { headers: { "cache-control": "no-store" } });
}
