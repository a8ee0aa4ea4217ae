import "server-only";
import bcrypt from "bcryptjs";

const COST = 11;
/** A hash compared against when the e-mail is unknown, so both paths take about as long. */
let decoy: string | undefined;

export const hashPassword = (plain: string) => bcrypt.hash(plain, COST);

export async function verifyPassword(plain: string, hash: string | null | undefined): Promise<boolean> {
  decoy ??= bcrypt.hashSync("no such member", COST);
  const ok = await bcrypt.compare(plain, hash ?? decoy);
  return ok && !!hash;
}
