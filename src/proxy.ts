import { NextResponse, type NextRequest } from "next/server";

// Redirects only: with no session cookie, member and officer pages go to sign-in.
// Every page, handler and action still checks the session and role itself.
const SESSION_COOKIES = ["__Secure-authjs.session-token", "authjs.session-token"];

export function proxy(request: NextRequest) {
  if (SESSION_COOKIES.some((name) => request.cookies.has(name))) return NextResponse.next();
  const url = request.nextUrl.clone();
  url.pathname = "/sign-in";
  url.search = `?from=${encodeURIComponent(request.nextUrl.pathname)}`;
  return NextResponse.redirect(url);
}

// Member screens are offline shells that find their member on the device; only the
// server-rendered officers' console is redirected here.
export const config = { matcher: ["/club/:path*"] };
