import "server-only";
import { DrizzleAdapter } from "@auth/drizzle-adapter";
import { eq } from "drizzle-orm";
import NextAuth, { type NextAuthConfig } from "next-auth";
import Credentials from "next-auth/providers/credentials";
import Nodemailer from "next-auth/providers/nodemailer";
import { z } from "zod";
import { safeReturnPath } from "@/lib/web/return-path";
import { getDb } from "../db";
import { accounts, authSessions, members, verificationTokens } from "../db/schema";
import { MISSING_ORIGIN_MESSAGE, serverEnv, siteOrigin } from "../env";
import { AppError } from "../errors";
import { logger } from "../log";
import { mailFrom, sendMailLater, smtpSettings } from "../mail";
import { signInLinkMessage } from "../mail/messages";
import { siteLink } from "../site-link";
import { hashPassword, isLegacyHash, verifyPassword } from "./password";
import { loadActor } from "./actor";
import { authSecret } from "./secret";
import { endSession, openSession } from "./sessions";
import { attemptFailed, attemptSucceeded, attemptUnavailable, beginAttempt, mayMailSignInLink } from "./sign-in-guard";

/** A week in the field and back without signing in again. */
export const SESSION_MAX_AGE_S = 14 * 24 * 60 * 60;

const credentialsSchema = z.object({ email: z.string().trim().toLowerCase().pipe(z.email().max(254)), password: z.string().min(1).max(200) });

function activeMemberByEmail(email: string) {
  return getDb()
    .select({
      id: members.id,
      email: members.email,
      name: members.name,
      passwordHash: members.passwordHash,
      active: members.active,
      sv: members.sessionVersion,
    })
    .from(members)
    .where(eq(members.email, email.trim().toLowerCase()))
    .get();
}

/**
 * The credentials check. The e-mail that is limited is the one that is checked: both come
 * from this one parse of what Auth.js hands over, whatever shape the request body had.
 */
async function authorizePassword(raw: unknown, request: Request) {
  const parsed = credentialsSchema.safeParse(raw);
  if (!parsed.success) return null;
  const email = parsed.data.email;
  const attempt = await beginAttempt(email, request);
  const row = activeMemberByEmail(email);
  let ok: boolean;
  try {
    ok = await verifyPassword(parsed.data.password, row?.passwordHash);
  } catch (error) {
    if (error instanceof AppError) attemptUnavailable(attempt, error.message);
    throw error;
  }
  if (!ok || !row || !row.active) {
    attemptFailed(attempt);
    return null;
  }
  attemptSucceeded(attempt);
  if (isLegacyHash(row.passwordHash!)) {
    // Hashes from before argon2id are replaced the first time their password is proved.
    const passwordHash = await hashPassword(parsed.data.password);
    getDb().update(members).set({ passwordHash }).where(eq(members.id, row.id)).run();
  }
  return { id: row.id, email: row.email, name: row.name };
}

/** Where Auth.js sends the browser after a sign-in e-mail was asked for (its own verify-request step). */
const CHECK_MAIL = "/api/auth/verify-request?provider=nodemailer&type=email";

function config(): NextAuthConfig {
  const db = getDb();
  const env = serverEnv();
  const origin = siteOrigin(env);
  // Auth.js builds its own URLs (the e-mail link among them) from AUTH_URL when it is set,
  // and from the request's Host and X-Forwarded-* headers when not: never let it do that.
  if (origin) process.env.AUTH_URL = `${origin}/api/auth`;
  return {
    adapter: DrizzleAdapter(db, {
      usersTable: members,
      accountsTable: accounts,
      sessionsTable: authSessions,
      verificationTokensTable: verificationTokens,
    }),
    secret: authSecret(),
    session: { strategy: "jwt", maxAge: SESSION_MAX_AGE_S },
    trustHost: true,
    useSecureCookies: origin?.startsWith("https:") ?? env.NODE_ENV === "production",
    pages: { signIn: "/sign-in", verifyRequest: "/sign-in/check-mail", error: "/sign-in" },
    providers: [
      Credentials({ credentials: { email: {}, password: {} }, authorize: authorizePassword }),
      Nodemailer({
        server: smtpSettings(),
        from: mailFrom(),
        maxAge: 30 * 60,
        async sendVerificationRequest({ identifier, url }) {
          // The origin and the mail limits were checked in the signIn callback, before the token was stored.
          if (!siteOrigin()) {
            logger.warn({ code: "unavailable:origin" }, MISSING_ORIGIN_MESSAGE);
            return;
          }
          // Rebuilt on the configured origin whatever Auth.js was given, with a same-site return path.
          const given = new URL(url);
          const callbackUrl = safeReturnPath(given.searchParams.get("callbackUrl")?.replace(/^https?:\/\/[^/]+/, ""));
          given.searchParams.set("callbackUrl", callbackUrl);
          sendMailLater({ to: identifier, ...signInLinkMessage(siteLink(`${given.pathname}${given.search}`)) }, "sign-in link");
        },
      }),
    ],
    callbacks: {
      // Only active members may sign in, whichever way; nobody is created by signing in.
      async signIn({ user, email }) {
        const row = user.email ? activeMemberByEmail(user.email) : undefined;
        if (!email?.verificationRequest) return !!row?.active;
        // Asking for a sign-in e-mail: a stranger, a member past the mail limits, and a club
        // with no origin configured get exactly the answer a member gets (the "check your
        // mail" page), but no token is stored and nothing is sent. Refusing instead would
        // answer with an error page, telling anyone who is a member.
        const send = !!row?.active && !!siteOrigin() && (await mayMailSignInLink(row.email));
        return send || CHECK_MAIL;
      },
      // Only paths on this site, resolved against the configured origin.
      redirect({ url, baseUrl }) {
        const base = origin ?? baseUrl;
        const path = url.startsWith(base) ? url.slice(base.length) || "/" : url;
        return `${base}${safeReturnPath(path, base)}`;
      },
      jwt({ token, user }) {
        if (user?.email) {
          const row = activeMemberByEmail(user.email);
          token.sub = row?.id;
          token.sv = row?.sv;
          token.sid = row ? openSession(row.id) : undefined;
          return token;
        }
        // Auth.js's own session endpoint renews the cookie through here: a session signed out
        // (its row gone), ended by a role change or a deactivation is over there too.
        return loadActor(token) ? token : null;
      },
      session({ session, token }) {
        if (token.sub) session.user.id = token.sub;
        return session;
      },
    },
    events: {
      signOut(message) {
        if ("token" in message) endSession(message.token?.sid);
      },
    },
    logger: {
      error(error) {
        logger.warn({ code: "auth", name: error.name }, "auth refused");
      },
    },
  };
}

export const { handlers, signIn, signOut } = NextAuth(() => config());
