import { NextRequest } from "next/server";
import { handlers } from "@/server/auth";
import { withSignInScope } from "@/server/auth/sign-in-guard";
import { AppError } from "@/server/errors";
import { siteOrigin } from "@/server/env";
import { readBodyLimited, route } from "@/server/http";

/** Auth.js reads `nextUrl`, which only a NextRequest has (Next always passes one; tests may not). */
const asNext = (req: Request) => (req instanceof NextRequest ? req : new NextRequest(req));

export const GET = (req: Request) => handlers.GET(asNext(req));

/** Sign-in bodies are a few short fields; anything longer is refused while it streams. */
const MAX_AUTH_BODY_BYTES = 8 * 1024;

/**
 * Auth.js's own endpoints. The body is read once, within a limit, and handed on unchanged;
 * the sign-in limits live where Auth.js checks the credentials (auth/sign-in-guard.ts), so no
 * body shape can step around them. A held-back attempt is answered 429 with Retry-After.
 */
export const POST = route(async (req) => {
  const body = await readBodyLimited(req, MAX_AUTH_BODY_BYTES, "sign_in");
  const forwarded = new NextRequest(req.url, { method: "POST", headers: req.headers, body: body.length > 0 ? new Uint8Array(body) : undefined });
  return withSignInScope(async (scope) => {
    const res = await handlers.POST(forwarded);
    if (scope.refused) {
      throw new AppError(scope.refused.status === 429 ? "rate_limited:sign_in" : "unavailable:sign_in", scope.refused.message, {
        retryAfter: [String(scope.refused.retryAfterS)],
      });
    }
    const secure = siteOrigin()?.startsWith("https:") ? "; Secure" : "";
    for (const c of scope.setCookies) res.headers.append("Set-Cookie", `${c.name}=${c.value}; Path=/; Max-Age=${c.maxAgeS}; HttpOnly; SameSite=Lax${secure}`);
    return res;
  }, req.headers);
});
