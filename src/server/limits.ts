import "server-only";
import { RateLimiterMemory, RateLimiterRes } from "rate-limiter-flexible";
import { AppError } from "./errors";

/**
 * Abuse limits, all in one place. Counted per account and per address, in this process's
 * memory (one server process per club); a member who hits a limit affects nobody else.
 */
export const LIMITS = {
  signInPerAccount: { points: 10, duration: 60 },
  signInPerAddress: { points: 30, duration: 60 },
  pushPerAccount: { points: 120, duration: 60 },
  pushPerAddress: { points: 240, duration: 60 },
  photoPerAccount: { points: 120, duration: 60 },
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

/** The caller's address as the server in front saw it (Next sets x-forwarded-for). */
export function clientAddress(req: Request): string {
  return req.headers.get("x-forwarded-for")?.split(",")[0]?.trim() || req.headers.get("x-real-ip") || "unknown";
}

/** Counts one attempt against each named limit; throws a 429 AppError carrying Retry-After. */
export async function spend(checks: [LimitName, string][]): Promise<void> {
  for (const [name, key] of checks) {
    try {
      await limiter(name).consume(key);
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
