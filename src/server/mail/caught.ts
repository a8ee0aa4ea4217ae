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
