import "server-only";
import RateLimiterMemory from "rate-limiter-flexible/lib/RateLimiterMemory";
import RateLimiterRes from "rate-limiter-flexible/lib/RateLimiterRes";
import { AppError } from "./errors";

/**
 * Abuse limits, all in one place. Counted per account and per address, in this process's
 * memory (one server process per club); a member who hits a limit affects nobody else.
 */
export const LIMITS = {
  /** Password attempts from one address, whatever the account (the per-account delay is in auth/sign-in-guard.ts). */
  signInPerAddress: { points: 30, duration: 60 },
  /** Requests for a sign-in e-mail: per address, per account, and per account from one address, an hour. */
  signInMailPerAddress: { points: 20, duration: 3600 },
  signInMailPerAccount: { points: 6, duration: 3600 },
  signInMailPerAccountAddress: { points: 3, duration: 3600 },
  /** Invitation links tried from one address (joining), a minute. */
  joinPerAddress: { points: 20, duration: 60 },
  pushPerAccount: { points: 120, duration: 60 },
  pushPerAddress: { points: 240, duration: 60 },
  photoPerAccount: { points: 120, duration: 60 },
  /** Basemap chunks (4 MB each) from one officer, a minute: 2 GB, far above any real upload. */
  basemapChunkPerAccount: { points: 500, duration: 60 },
  /** Whole-basemap answers (up to 300 MB each) to one member, an hour, however asked for: a phone keeps one copy; this leaves room for retries. */
  basemapWholePerAccount: { points: 10, duration: 3600 },
  /** KiB of the basemap read by range (the map's tiles) by one member, an hour: 4 GiB, far above a day's map use; a script reading the archive piece by piece is held to it. */
  basemapRangeKiBPerAccount: { points: 4 * 1024 * 1024, duration: 3600 },
} as const;

type LimitName = keyof typeof LIMITS;
const limiters = new Map<LimitName, RateLimiterMemory>();

function limiter(name: LimitName): RateLimiterMemory {
  let l = limiters.get(name);
  if (!l) {
    l = new RateLimiterMemory({ ...LIMITS[name], keyPrefix: name });
    limiters.set(name, l);
  }
  return l;
}

/** Counts one attempt (or `points`) against each named limit; throws a 429 AppError carrying Retry-After. */
export async function spend(checks: [name: LimitName, key: string, points?: number][]): Promise<void> {
  for (const [name, key, points = 1] of checks) {
    try {
      await limiter(name).consume(key, points);
    } catch (error) {
      if (!(error instanceof RateLimiterRes)) throw error;
      const retryAfterS = Math.max(1, Math.ceil(error.msBeforeNext / 1000));
      throw new AppError(`rate_limited:${name}`, `Too many attempts. Wait ${retryAfterS} s and try again.`, { retryAfter: [String(retryAfterS)] });
    }
  }
}

/** For tests: forget every count. */
export function resetLimits(): void {
  limiters.clear();
}
