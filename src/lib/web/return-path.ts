/** The base a return path is resolved against when only its shape matters. */
const PROBE_ORIGIN = "https://lodebook.invalid";

/**
 * A path on this site to go to after signing in, or "/" for anything else. Parsed with `URL`
 * against the origin, so only what resolves to this origin passes; control characters,
 * backslashes and any whitespace are refused outright (browsers strip or reinterpret them,
 * which is how "/\t/evil.example" and "/\\evil.example" become other hosts).
 */
export function safeReturnPath(from: unknown, origin: string = PROBE_ORIGIN): string {
  if (typeof from !== "string" || from.length === 0 || from.length > 500) return "/";
  if (!from.startsWith("/") || from.startsWith("//")) return "/";
  if (/[\s\\\u0000-\u001f\u007f-\u009f\u200b-\u200f\u2028-\u202e\u2060-\u206f\ufeff]/u.test(from)) return "/";
  let url: URL;
  try {
    url = new URL(from, origin);
  } catch {
    return "/";
  }
  if (url.origin !== new URL(origin).origin) return "/";
  // Dot segments collapse while parsing ("/.//evil.example", "/a/%2e%2e//evil.example"): a
  // path that comes out starting with "//" would be read by a browser as another host.
  if (url.pathname.startsWith("//")) return "/";
  return `${url.pathname}${url.search}${url.hash}`;
}
