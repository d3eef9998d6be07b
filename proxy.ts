import { NextResponse, type NextRequest } from "next/server";

/**
 * Coarse redirect only: a page request without a session cookie goes to /sign-in. This is never the
 * authorization check — layouts and every route handler validate the session themselves.
 * (Cookie name kept literal: proxy runs apart from the server bundle and must not import lib/auth.)
 */
const SESSION_COOKIE = "tidewright_session";

export function proxy(request: NextRequest) {
  if (request.cookies.has(SESSION_COOKIE)) return NextResponse.next();
  const url = request.nextUrl.clone();
  const next = `${request.nextUrl.pathname}${request.nextUrl.search}`;
  url.pathname = "/sign-in";
  url.search = next === "/" ? "" : `?next=${encodeURIComponent(next)}`;
  return NextResponse.redirect(url);
}

export const config = {
  // Everything except the API (answers 401 itself), the sign-in page, Next's assets and static files.
  matcher: ["/((?!api/|sign-in|_next/|favicon\\.ico|icon\\.svg|.*\\.(?:woff2|svg|png|ico|txt)$).*)"],
};
