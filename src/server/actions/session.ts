"use server";
import { AuthError } from "next-auth";
import { headers } from "next/headers";
import { z } from "zod";
import { defineAction, safeReturnPath } from "../action";
import { signIn, signOut } from "../auth";
import { AppError } from "../errors";
import { spend } from "../limits";

/** The same sign-in limits as the Auth.js endpoints, for the form's own path. */
async function signInLimited(email: string) {
  const h = await headers();
  const address = h.get("x-forwarded-for")?.split(",")[0]?.trim() || "unknown";
  try {
    await spend([
      ["signInPerAddress", address],
      ["signInPerAccount", email.trim().toLowerCase()],
    ]);
    return null;
  } catch (error) {
    if (error instanceof AppError) return { ok: false, message: error.message };
    throw error;
  }
}

const passwordForm = z.object({
  email: z.email("Enter your e-mail address.").max(254),
  password: z.string().min(1, "Enter your password.").max(200),
  from: z.string().max(500).optional(),
});

export const signInWithPassword = defineAction({ public: true }, passwordForm, async (input) => {
  const limited = await signInLimited(input.email);
  if (limited) return limited;
  try {
    await signIn("credentials", { email: input.email, password: input.password, redirectTo: safeReturnPath(input.from) });
  } catch (error) {
    // signIn redirects by throwing; only Auth.js's own errors mean the sign-in failed.
    if (error instanceof AuthError) {
      return { ok: false, message: "That e-mail and password do not match an active member. Check both and try again.", fields: { password: ["Wrong e-mail or password."] } };
    }
    throw error;
  }
});

const linkForm = z.object({ email: z.email("Enter your e-mail address.").max(254), from: z.string().max(500).optional() });

export const sendSignInLink = defineAction({ public: true }, linkForm, async (input) => {
  const limited = await signInLimited(input.email);
  if (limited) return limited;
  try {
    // Unknown addresses are refused by the signIn callback; the member sees the same page
    // either way, so the form cannot be used to learn who belongs to the club.
    await signIn("nodemailer", { email: input.email.trim().toLowerCase(), redirectTo: safeReturnPath(input.from), redirect: false });
  } catch (error) {
    if (!(error instanceof AuthError)) throw error;
  }
  return { ok: true, message: "If that address belongs to a member, a sign-in link is on its way. It works once, for 30 minutes." };
});

// Signing out needs no live session: it only clears this browser's cookie.
export const signOutNow = defineAction({ public: true }, z.object({}), async () => {
  await signOut({ redirectTo: "/sign-in?signedOut=1" });
});
