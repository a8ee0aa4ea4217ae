import "server-only";
import { DrizzleAdapter } from "@auth/drizzle-adapter";
import { eq } from "drizzle-orm";
import NextAuth, { type NextAuthConfig } from "next-auth";
import Credentials from "next-auth/providers/credentials";
import Nodemailer from "next-auth/providers/nodemailer";
import { z } from "zod";
import { getDb } from "../db";
import { accounts, authSessions, members, verificationTokens } from "../db/schema";
import { mailFrom, smtpSettings } from "../mail";
import { signInLinkMessage } from "../mail/messages";
import { sendMail } from "../mail";
import { verifyPassword } from "./password";

/** A week in the field and back without signing in again. */
export const SESSION_MAX_AGE_S = 14 * 24 * 60 * 60;

const credentialsSchema = z.object({ email: z.email().max(254), password: z.string().min(1).max(200) });

function activeMemberByEmail(email: string) {
  return getDb()
    .select({ id: members.id, email: members.email, name: members.name, passwordHash: members.passwordHash, active: members.active, sv: members.sessionVersion })
    .from(members)
    .where(eq(members.email, email.trim().toLowerCase()))
    .get();
}

function config(): NextAuthConfig {
  const db = getDb();
  return {
    adapter: DrizzleAdapter(db, {
      usersTable: members,
      accountsTable: accounts,
      sessionsTable: authSessions,
      verificationTokensTable: verificationTokens,
    }),
    session: { strategy: "jwt", maxAge: SESSION_MAX_AGE_S },
    trustHost: true,
    pages: { signIn: "/sign-in", verifyRequest: "/sign-in/check-mail", error: "/sign-in" },
    providers: [
      Credentials({
        credentials: { email: {}, password: {} },
        async authorize(raw) {
          const parsed = credentialsSchema.safeParse(raw);
          if (!parsed.success) return null;
          const row = activeMemberByEmail(parsed.data.email);
          const ok = await verifyPassword(parsed.data.password, row?.passwordHash);
          if (!ok || !row || !row.active) return null;
          return { id: row.id, email: row.email, name: row.name };
        },
      }),
      Nodemailer({
        server: smtpSettings(),
        from: mailFrom(),
        maxAge: 30 * 60,
        async sendVerificationRequest({ identifier, url }) {
          await sendMail({ to: identifier, ...signInLinkMessage(url) });
        },
      }),
    ],
    callbacks: {
      // Only active members may sign in, whichever way; nobody is created by signing in.
      signIn({ user }) {
        const row = user.email ? activeMemberByEmail(user.email) : undefined;
        return !!row?.active;
      },
      jwt({ token, user }) {
        if (user?.email) {
          const row = activeMemberByEmail(user.email);
          token.sub = row?.id;
          token.sv = row?.sv;
        }
        return token;
      },
      session({ session, token }) {
        if (token.sub) session.user.id = token.sub;
        (session as { sv?: unknown }).sv = token.sv;
        return session;
      },
    },
  };
}

export const { handlers, auth, signIn, signOut } = NextAuth(() => config());
