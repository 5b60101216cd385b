import { NextResponse, type NextRequest } from "next/server";
import { getToken } from "next-auth/jwt";

/** Sends signed-out visitors to sign-in. Authorisation itself happens in every handler and page. */
export async function proxy(req: NextRequest) {
  const token = await getToken({ req, secret: process.env.NEXTAUTH_SECRET });
  if (token) return NextResponse.next();
  const url = new URL("/sign-in", req.url);
  const target = req.nextUrl.pathname + req.nextUrl.search;
  if (target !== "/") url.searchParams.set("callbackUrl", target);
  return NextResponse.redirect(url);
}

export const config = {
  matcher: ["/((?!api|_next/static|_next/image|sign-in|invitation|favicon.ico|icon.svg|.*\\.(?:woff2?|ttf|png|svg)$).*)"],
};
