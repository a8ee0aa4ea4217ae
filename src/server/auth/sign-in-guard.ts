import "server-only";
import { AsyncLocalStorage } from "node:async_hooks";
import crypto from "node:crypto";
import { CredentialsSignin } from "next-auth";
import { clientAddress } from "../client-address";
import { AppError } from "../errors";
import { spend } from "../limits";
import { logger } from "../log";
import { authSecret } from "./secret";

/**
 * Password guessing is slowed per account without letting a stranger lock a member out
 * (OWASP "Slow Down Online Guessing Attacks with Device Cookies", and its Blocking Brute Force
 * guidance):
 * - A browser that signed in as this member before carries a signed device cookie. It is not
 *   held by the account's delay; only its own failures count, and after DEVICE_FAILURES within
 *   DEVICE_WINDOW_S it stops counting as known for that window.
 * - Any other browser shares the account's delay: after UNKNOWN_FREE_FAILURES failures each
 *   attempt must wait 2^(n − free) seconds after the last failure, up to UNKNOWN_MAX_DELAY_S.
 *   A success, or FORGET_AFTER_S without failures, clears it.
 * - Every attempt counts against its address (LIMITS.signInPerAddress), whatever the account.
 */
export const SIGN_IN_POLICY = {
  unknownFreeFailures: 5,
  unknownMaxDelayS: 15 * 60,
  forgetAfterS: 24 * 60 * 60,
  deviceFailures: 10,
  deviceWindowS: 15 * 60,
  deviceCookieDays: 180,
} as const;

const MAX_TRACKED = 50_000;

type Delay = { failures: number; lastAt: number };
const unknownDelays = new Map<string, Delay>();
type DeviceCount = { failures: number; since: number };
const deviceCounts = new Map<string, DeviceCount>();

/**
 * Keeps a count, dropping the oldest one that no longer holds anything back when full, so a
 * flood of other accounts cannot flush a delay that is still running. Only when every one of
 * the oldest is still active does the oldest go.
 */
function remember<K, V>(map: Map<K, V>, key: K, value: V, active: (v: V) => boolean) {
  map.delete(key);
  if (map.size >= MAX_TRACKED) {
    let victim: K | undefined;
    let looked = 0;
    for (const [k, v] of map) {
      victim ??= k;
      if (!active(v)) {
        victim = k;
        break;
      }
      if (++looked >= 256) break;
    }
    map.delete(victim as K);
  }
  map.set(key, value);
}

const hmac = (data: string) => crypto.createHmac("sha256", authSecret()).update(data).digest("base64url");

/** One cookie per account a browser has signed in as, named by a keyed hash of the address. */
export const deviceCookieName = (email: string) => `lodebook-known-${hmac(`device-name|${email}`).slice(0, 16)}`;

function deviceCookieValue(email: string, now: number): string {
  const nonce = crypto.randomBytes(12).toString("base64url");
  const issued = Math.floor(now / 1000);
  return `${nonce}.${issued}.${hmac(`device|${email}|${nonce}|${issued}`)}`;
}

function readCookie(header: string | null, name: string): string | undefined {
  for (const part of (header ?? "").split(";")) {
    const at = part.indexOf("=");
    if (at > 0 && part.slice(0, at).trim() === name) return part.slice(at + 1).trim();
  }
  return undefined;
}

/** The device cookie's nonce when the browser holds a valid one for this account. */
function knownDevice(email: string, headers: Headers, now: number): string | null {
  const value = readCookie(headers.get("cookie"), deviceCookieName(email));
  const [nonce, issued, sig] = value?.split(".") ?? [];
  if (!nonce || !issued || !sig) return null;
  const expected = hmac(`device|${email}|${nonce}|${issued}`);
  if (sig.length !== expected.length || !crypto.timingSafeEqual(Buffer.from(sig), Buffer.from(expected))) return null;
  if (now / 1000 - Number(issued) > SIGN_IN_POLICY.deviceCookieDays * 86_400) return null;
  const count = deviceCounts.get(nonce);
  if (count && now - count.since < SIGN_IN_POLICY.deviceWindowS * 1000 && count.failures >= SIGN_IN_POLICY.deviceFailures) return null;
  return nonce;
}

function unknownWaitS(email: string, now: number): number {
  const d = unknownDelays.get(email);
  if (!d) return 0;
  if (now - d.lastAt > SIGN_IN_POLICY.forgetAfterS * 1000) {
    unknownDelays.delete(email);
    return 0;
  }
  const over = d.failures - SIGN_IN_POLICY.unknownFreeFailures;
  if (over < 0) return 0;
  const delayS = Math.min(SIGN_IN_POLICY.unknownMaxDelayS, 2 ** over);
  return Math.max(0, Math.ceil((d.lastAt + delayS * 1000 - now) / 1000));
}

/** What one sign-in request learned, for the handler or action that set it going. */
export type SignInScope = {
  /** The caller's address as the front door settled it, for limits counted inside Auth.js's callbacks. */
  address: string;
  /** The request's headers (its cookies), for checks made inside Auth.js's callbacks. */
  headers: Headers;
  setCookies: { name: string; value: string; maxAgeS: number }[];
  /** Set when the attempt was held back rather than wrong: the caller answers 429 or 503. */
  refused?: { status: 429 | 503; message: string; retryAfterS: number };
};
const scope = new AsyncLocalStorage<SignInScope>();

export function withSignInScope<T>(work: (s: SignInScope) => Promise<T>, headers: Headers = new Headers()): Promise<T> {
  const s: SignInScope = { address: clientAddress(headers), headers, setCookies: [] };
  return scope.run(s, () => work(s));
}

/** Auth.js turns this into a failed sign-in; the scope tells the caller it was the limit. */
export class SignInLimited extends CredentialsSignin {
  code = "rate_limited";
}

export type Attempt = { email: string; device: string | null; now: number };

/**
 * Before the password is checked: the address's limit, then the account's delay for unknown
 * browsers. The attempt is counted as a failure here, before the (slow) password check, and
 * cleared if it succeeds: counted only after the check, a burst sent at once would all pass
 * the delay before the first failure was recorded.
 */
export async function beginAttempt(email: string, request: Request, now = Date.now()): Promise<Attempt> {
  try {
    await spend([["signInPerAddress", clientAddress(request)]]);
  } catch (error) {
    if (error instanceof AppError) limited(Number(error.fields?.retryAfter?.[0] ?? 60), email, "address");
    throw error;
  }
  const device = knownDevice(email, request.headers, now);
  if (!device) {
    const wait = unknownWaitS(email, now);
    if (wait > 0) limited(wait, email, "account");
  }
  const attempt = { email, device, now };
  countFailure(attempt);
  return attempt;
}

function countFailure(a: Attempt, by = 1): void {
  if (a.device) {
    const c = deviceCounts.get(a.device);
    const fresh = !c || a.now - c.since >= SIGN_IN_POLICY.deviceWindowS * 1000;
    remember(
      deviceCounts,
      a.device,
      fresh ? { failures: Math.max(0, by), since: a.now } : { failures: Math.max(0, c.failures + by), since: c.since },
      (v) => Date.now() - v.since < SIGN_IN_POLICY.deviceWindowS * 1000,
    );
    return;
  }
  const d = unknownDelays.get(a.email);
  remember(
    unknownDelays,
    a.email,
    { failures: Math.max(0, (d?.failures ?? 0) + by), lastAt: by > 0 ? a.now : (d?.lastAt ?? a.now) },
    (v) => v.failures > 0 && Date.now() - v.lastAt < SIGN_IN_POLICY.forgetAfterS * 1000,
  );
}

function limited(retryAfterS: number, email: string, by: string): never {
  const s = scope.getStore();
  if (s) s.refused = { status: 429, message: `Too many sign-in attempts. Wait ${waitWords(retryAfterS)} and try again.`, retryAfterS };
  logger.warn({ code: "rate_limited:sign_in", by, account: hmac(`log|${email}`).slice(0, 12) }, "sign-in held back");
  throw new SignInLimited();
}

function waitWords(s: number): string {
  return s < 90 ? `${s} seconds` : `${Math.ceil(s / 60)} minutes`;
}

/** The server could not check the password now (hashing queue full): not a wrong password, so not counted. */
export function attemptUnavailable(a: Attempt, message: string): never {
  countFailure(a, -1);
  const s = scope.getStore();
  if (s) s.refused = { status: 503, message, retryAfterS: 5 };
  throw new SignInLimited();
}

/** A wrong password: already counted when the attempt began (see beginAttempt). */
export function attemptFailed(_a: Attempt): void {}

/** A success clears the account's delay and gives this browser a fresh device cookie. */
export function attemptSucceeded(a: Attempt): void {
  unknownDelays.delete(a.email);
  if (a.device) deviceCounts.delete(a.device);
  scope
    .getStore()
    ?.setCookies.push({ name: deviceCookieName(a.email), value: deviceCookieValue(a.email, a.now), maxAgeS: SIGN_IN_POLICY.deviceCookieDays * 86_400 });
}

/**
 * Sign-in e-mails: counted where the address is known for sure (Auth.js's own identifier),
 * per account and address, per account, and per address, before any token is stored. Over a
 * limit nothing is stored or sent and the answer stays the same, so the form cannot tell who
 * belongs to the club. The caller's address comes from the sign-in scope.
 */
export async function mayMailSignInLink(email: string): Promise<boolean> {
  const s = scope.getStore();
  const address = s?.address ?? "unknown";
  // The member's own browser (device cookie) is not held by the per-account hourly count, which
  // a stranger could otherwise spend to keep the member's links from coming.
  const known = s ? knownDevice(email, s.headers, Date.now()) !== null : false;
  try {
    await spend([
      ["signInMailPerAddress", address],
      ...(known ? [] : ([["signInMailPerAccount", email]] as ["signInMailPerAccount", string][])),
      ["signInMailPerAccountAddress", `${email}|${address}`],
    ]);
    return true;
  } catch (error) {
    if (!(error instanceof AppError)) throw error;
    logger.warn({ code: error.code, account: hmac(`log|${email}`).slice(0, 12) }, "sign-in link not sent");
    return false;
  }
}

/** For tests: forget every count. */
export function resetSignInGuard(): void {
  unknownDelays.clear();
  deviceCounts.clear();
}
