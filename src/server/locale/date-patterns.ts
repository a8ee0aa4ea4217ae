import "server-only";
import { firstLanguage, learnDatePattern, type DatePattern } from "@/lib/date-pattern";

// Learning a locale's pattern formats a few hundred instants (a few milliseconds): once per
// locale. The header is the client's to choose, so the memo is bounded: past its size it starts
// again rather than grow with every tag a client invents.
const MEMO_SIZE = 64;
const memo = new Map<string, DatePattern | null>();

/** The date pattern of the request's first language (Accept-Language), or null. */
export function datePatternFor(req: Request): DatePattern | null {
  const tag = firstLanguage(req.headers.get("accept-language"));
  if (!tag) return null;
  const key = tag.toLowerCase();
  if (memo.has(key)) return memo.get(key) ?? null;
  const pattern = learnDatePattern(tag);
  if (memo.size >= MEMO_SIZE) memo.clear();
  memo.set(key, pattern);
  return pattern;
}
