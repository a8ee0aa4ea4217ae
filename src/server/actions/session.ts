"use server";
import { AuthError } from "next-auth";
import { cookies, headers } from "next/headers";
import { z } from "zod";
import { safeReturnPath } from "@/lib/web/return-path";
import { defineAction, type ActionState } from "../action";
import { signIn, signOut } from "../auth";
import { withSignInScope, type SignInScope } from "../auth/sign-in-guard";
import { clientAddress } from "../client-address";
import { siteOrigin } from "../env";
import { AppError } from "../errors";
import { spend } from "../limits";

const passwordForm = z.object({
  email: z.email("Enter your e-mail address.").max(254),
  password: z.string().min(1, "Enter your password.").max(200),
  from: z.string().max(500).optional(),
});

function isRedirect(error: unknown): boolean {
  return typeof error === "object" && error !== null && String((error as { digest?: unknown }).digest ?? "").startsWith("NEXT_REDIRECT");
}

async function keepDeviceCookies(scope: SignInScope) {
  const jar = await cookies();
  const secure = siteOrigin()?.startsWith("https:") ?? true;
  for (const c of scope.setCookies) jar.set(c.name, c.value, { httpOnly: true, sameSite: "lax", secure, path: "/", maxAge: c.maxAgeS });
}

/** A page asked for, or the landing that sends each role to its own home. */
function afterSignIn(from: unknown): string {
  const asked = safeReturnPath(from);
  return asked === "/" ? "/signed-in" : asked;
}

export const signInWithPassword = defineAction({ public: true }, passwordForm, async (input) =>
  withSignInScope(
    async (scope): Promise<ActionState | void> => {
      try {
        await signIn("credentials", { email: input.email, password: input.password, redirectTo: afterSignIn(input.from) });
      } catch (error) {
        if (error instanceof AuthError) {
          if (scope.refused) return { ok: false, message: scope.refused.message };
          return {
            ok: false,
            message: "That e-mail and password do not match an active member. Check both and try again.",
            fields: { password: ["Wrong e-mail or password."] },
          };
        }
        if (!isRedirect(error)) throw error;
        // Signed in (Auth.js redirects by throwing): remember this browser for the member.
        await keepDeviceCookies(scope);
        throw error;
      }
    },
    await headers(),
  ),
);

const linkForm = z.object({ email: z.email("Enter your e-mail address.").max(254), from: z.string().max(500).optional() });

export const sendSignInLink = defineAction({ public: true }, linkForm, async (input) => {
  try {
    await spend([["signInPerAddress", clientAddress(await headers())]]);
  } catch (error) {
    if (error instanceof AppError) return { ok: false, message: error.message };
    throw error;
  }
  try {
    // Unknown addresses and per-account limits skip the mail silently in the signIn callback
    // (counted against this caller's address): the answer is the same either way, so the form
    // cannot be used to learn who belongs to the club.
    await withSignInScope(
      () => signIn("nodemailer", { email: input.email.trim().toLowerCase(), redirectTo: afterSignIn(input.from), redirect: false }),
      await headers(),
    );
  } catch (error) {
    if (!(error instanceof AuthError)) throw error;
  }
  return { ok: true, message: "If that address belongs to a member, a sign-in link is on its way. It works once, for 30 minutes." };
});

// Signing out needs no live session. It ends this browser's session on the server (its row
// is deleted), so a copy of the cookie stops working too; the member's other devices stay in.
export const signOutNow = defineAction({ public: true }, z.object({}), async () => {
  await signOut({ redirectTo: "/sign-in?signedOut=1" });
});
