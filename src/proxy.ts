import { NextResponse, type NextRequest } from "next/server";
import { checkActionBody } from "./server/action-body";
import { AppError } from "./server/errors";
import { requireSameOrigin } from "./server/origin";

// The console's pages go to sign-in without a session cookie; every page, handler and action
// still checks the session and role itself. And a possible server action from another site, or
// one whose body React could not decode, is refused here: Next refuses those itself, but with a 500.
const SESSION_COOKIES = ["__Secure-authjs.session-token", "authjs.session-token"];

export async function proxy(request: NextRequest) {
  const { pathname } = request.nextUrl;
  if (request.method === "POST" && !pathname.startsWith("/api/")) {
    try {
      requireSameOrigin(request);
      await checkActionBody(request);
    } catch (error) {
      if (!(error instanceof AppError)) throw error;
      return NextResponse.json(error.toJSON(), { status: error.status, headers: { "Cache-Control": "no-store" } });
    }
  }
  if (!(pathname === "/club" || pathname.startsWith("/club/"))) return NextResponse.next();
  if (SESSION_COOKIES.some((name) => request.cookies.has(name))) return NextResponse.next();
  const url = request.nextUrl.clone();
  url.pathname = "/sign-in";
  url.search = `?from=${encodeURIComponent(pathname)}`;
  return NextResponse.redirect(url);
}

// Member screens are offline shells that find their member on the device: only the console's
// pages are matched for the redirect. Besides, every request Next may take as a server action
// (one naming an action in its header, a form body) comes through here; page loads do not.
// The front door (scripts/serve.mjs) has already refused the oversize ones, those of unknown
// length and an empty action header, so Next holds at most 64 kB of a body for this proxy.
// (Literals only: Next reads this object without running the module.)
export const config = {
  matcher: [
    "/club/:path*",
    { source: "/((?!api/|_next/).*)", has: [{ type: "header", key: "next-action" }] },
    { source: "/((?!api/|_next/).*)", has: [{ type: "header", key: "content-type", value: "(?:multipart/form-data|application/x-www-form-urlencoded).*" }] },
  ],
};
