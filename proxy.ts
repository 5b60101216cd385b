import { NextResponse, type NextRequest } from "next/server";
import { getToken } from "next-auth/jwt";
import { pageContentSecurityPolicy } from "@/lib/security/headers";

/** Pages a signed-out visitor may open: sign-in, and the invitation link a client contact follows. */
const isPublicPage = (pathname: string) => pathname === "/sign-in" || pathname.startsWith("/invitation/");

/**
 * Pages only: a nonce-based Content-Security-Policy per request, and signed-out visitors sent to
 * sign-in. Never the API: a proxy makes Next buffer request bodies, cut at 10 MB
 * (proxyClientMaxBodySize), which would truncate ledger uploads; API routes check cross-site
 * writes in lib/auth/with-role.ts instead. Authorisation itself happens in every handler and page.
 */
export async function proxy(req: NextRequest) {
  const nonce = Buffer.from(crypto.randomUUID()).toString("base64");
  const csp = pageContentSecurityPolicy(nonce, { dev: process.env.NODE_ENV === "development" });
  const isPublic = isPublicPage(req.nextUrl.pathname);
  const token = isPublic ? null : await getToken({ req, secret: process.env.NEXTAUTH_SECRET });
  let res: NextResponse;
  if (token || isPublic) {
    const requestHeaders = new Headers(req.headers);
    requestHeaders.set("x-nonce", nonce);
    requestHeaders.set("Content-Security-Policy", csp);
    res = NextResponse.next({ request: { headers: requestHeaders } });
  } else {
    const url = new URL("/sign-in", req.url);
    const target = req.nextUrl.pathname + req.nextUrl.search;
    if (target !== "/") url.searchParams.set("callbackUrl", target);
    res = NextResponse.redirect(url);
  }
  res.headers.set("Content-Security-Policy", csp);
  return res;
}

export const config = {
  matcher: ["/((?!api|_next/static|_next/image|favicon.ico|icon.svg|.*\\.(?:woff2?|ttf|png|svg)$).*)"],
};
