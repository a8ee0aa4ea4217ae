import { handlers } from "@/server/auth";
import { AppError } from "@/server/errors";
import { route } from "@/server/http";
import { clientAddress, spend } from "@/server/limits";

export const { GET } = handlers;

/**
 * Auth.js's own endpoints, with the sign-in limits in front: password attempts and e-mail
 * links are counted per account and per address before Auth.js sees them.
 */
export const POST = route(async (req) => {
  const path = new URL(req.url).pathname;
  if (path.endsWith("/callback/credentials") || path.endsWith("/signin/nodemailer")) {
    const form = await req.clone().formData().catch(() => null);
    const email = String(form?.get("email") ?? "").trim().toLowerCase();
    if (email.length > 254) throw new AppError("bad_request:sign_in", "That e-mail address is too long.", { email: ["too long"] });
    await spend([
      ["signInPerAddress", clientAddress(req)],
      ...(email ? ([["signInPerAccount", email]] as [ "signInPerAccount", string][]) : []),
    ]);
  }
  return handlers.POST(req as never);
});
