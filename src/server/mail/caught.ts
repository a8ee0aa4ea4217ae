import "server-only";
import { serverEnv } from "../env";
import fs from "node:fs/promises";
import path from "node:path";

/** A message held by the local mail catcher (development and demo only). */
export type CaughtMail = { id: string; at: string; from: string; to: string[]; subject: string; text: string };

/** Where the catcher writes; unset in production, which hides the caught-mail page. */
export const caughtMailDir = () => serverEnv().LODEBOOK_MAIL_DIR;

export async function listCaughtMail(limit = 50): Promise<CaughtMail[]> {
  const dir = caughtMailDir();
  if (!dir) return [];
  const names = await fs.readdir(dir).catch(() => [] as string[]);
  const files = names
    .filter((n) => n.endsWith(".json"))
    .sort()
    .reverse()
    .slice(0, limit);
  const out: CaughtMail[] = [];
  for (const name of files) {
    out.push(JSON.parse(await fs.readFile(path.join(dir, name), "utf8")) as CaughtMail);
  }
  return out;
}

/** A sign-in link's address: Auth.js's e-mail callback, with its one-time token. */
const SIGN_IN_LINK = /https?:\/\/[^\s<>"]*\/api\/auth\/callback\/[^\s<>"]*/g;

/**
 * A caught message as `reader` may see it. The catcher stands in for every person's mailbox,
 * but a sign-in link signs in whoever opens it: one addressed to someone else is shown only as
 * a note, so an officer reading the catcher cannot sign in as a member. Everything else is shown
 * whole: query notices, and invitations (any officer may invite anyone, so an invitation link
 * gives an officer nothing they could not make themselves).
 */
export function asReadBy(mail: CaughtMail, reader: string): CaughtMail {
  const own = mail.to.some((to) => to.trim().toLowerCase() === reader.trim().toLowerCase());
  if (own) return mail;
  return { ...mail, text: mail.text.replace(SIGN_IN_LINK, `[a sign-in link for ${mail.to.join(", ")}: only they can open it, from their own mailbox]`) };
}
