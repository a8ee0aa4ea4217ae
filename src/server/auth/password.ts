import "server-only";
import { hash as argon2Hash, verify as argon2Verify } from "@node-rs/argon2";
import { verify as bcryptVerify } from "@node-rs/bcrypt";
import os from "node:os";
import pLimit from "p-limit";
import { AppError } from "../errors";

/**
 * Password hashing runs on libuv's thread pool (native argon2id), never on the event loop,
 * and at most HASH_CONCURRENCY at once (half the cores, at least one): a burst of sign-ins or
 * joins waits its turn instead of taking every core from the members' other requests. Past HASH_QUEUE waiting, callers are told to try again shortly.
 * Parameters: argon2id, 19 MiB, 2 passes, 1 lane (OWASP Password Storage Cheat Sheet).
 */
export const HASH_CONCURRENCY = Math.max(1, Math.floor(os.availableParallelism() / 2));
export const HASH_QUEUE = 64;
const ARGON2 = { memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const;

const slots = pLimit(HASH_CONCURRENCY);

function inSlot<T>(work: () => Promise<T>): Promise<T> {
  if (slots.pendingCount >= HASH_QUEUE) {
    return Promise.reject(new AppError("unavailable:password", "The server is busy checking passwords. Try again in a few seconds."));
  }
  return slots(work);
}

export const hashPassword = (plain: string): Promise<string> => inSlot(() => argon2Hash(plain, ARGON2));

/** Hashes made before argon2id (bcrypt, "$2a$"/"$2b$") still verify, and are replaced on the next sign-in. */
export const isLegacyHash = (stored: string) => stored.startsWith("$2");

/** A hash compared against when the e-mail is unknown, so both paths take about as long. */
let decoy: Promise<string> | undefined;

export async function verifyPassword(plain: string, stored: string | null | undefined): Promise<boolean> {
  decoy ??= hashPassword("no such member");
  const against = stored ?? (await decoy);
  const ok = await inSlot(() => (isLegacyHash(against) ? bcryptVerify(plain, against) : argon2Verify(against, plain)));
  return ok && !!stored;
}
