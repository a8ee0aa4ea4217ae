import { NextResponse, type NextRequest } from "next/server";
import { AppError } from "./server/errors";
import { requireSameOrigin } from "./server/origin";

// Redirects only: with no session cookie, member and officer pages go to sign-in.
// Every page, handler and action still checks the session and role itself.
const SESSION_COOKIES = ["__Secure-authjs.session-token", "authjs.session-token"];

/** Server actions' body limit: next.config.mjs's serverActions.bodySizeLimit ("64kb"). */
export const ACTION_BODY_LIMIT = 64 * 1024;

const refuse = (status: number, code: string, message: string) =>
  NextResponse.json({ error: { code, message } }, { status, headers: { "Cache-Control": "no-store" } });

/**
 * A form post to a page (a server action, called by the app's own script or by a form with
 * no script): refused here when it comes from another site or is over the actions' body limit.
 * Next refuses both itself, but as a 500 (and a chunked body only once it is past the limit);
 * this answers them as what they are, before Next reads a byte.
 */
function refuseFormPost(request: NextRequest): Response | null {
  try {
    requireSameOrigin(request);
  } catch (error) {
    if (error instanceof AppError) return refuse(403, error.code, error.message);
    throw error;
  }
  const declared = request.headers.get("content-length");
  if (declared === null && request.headers.has("transfer-encoding"))
    return refuse(411, "length_required:form", "Send the form with its length (Content-Length).");
  if (Number(declared ?? "0") > ACTION_BODY_LIMIT)
    return refuse(413, "too_large:form", `The form is over ${ACTION_BODY_LIMIT / 1024} kB: shorten the longest field.`);
  return null;
}

export function proxy(request: NextRequest) {
  const { pathname } = request.nextUrl;
  if (request.method === "POST" && !pathname.startsWith("/api/")) {
    const refused = refuseFormPost(request);
    if (refused) return refused;
  }
  if (!(pathname === "/club" || pathname.startsWith("/club/"))) return NextResponse.next();
  if (SESSION_COOKIES.some((name) => request.cookies.has(name))) return NextResponse.next();
  const url = request.nextUrl.clone();
  url.pathname = "/sign-in";
  url.search = `?from=${encodeURIComponent(pathname)}`;
  return NextResponse.redirect(url);
}

// Member screens are offline shells that find their member on the device; only the
// server-rendered officers' console is redirected here. Besides, every request that can carry
// a server action (the app's own calls name one in a header; a form without script posts a
// form body) comes through here first; page loads do not. (Literals only: Next reads this
// object without running the module.)
export const config = {
  matcher: [
    "/club/:path*",
    { source: "/((?!api/|_next/).*)", has: [{ type: "header", key: "next-action" }] },
    {
      source: "/((?!api/|_next/).*)",
      has: [{ type: "header", key: "content-type", value: "(?:multipart/form-data|application/x-www-form-urlencoded|text/plain).*" }],
    },
  ],
};
