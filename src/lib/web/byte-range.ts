/**
 * One `Range: bytes=…` request header against a body of `size` bytes (RFC 9110 §14.1.2, §14.2):
 * the inclusive span to send, "unsatisfiable" (answer 416), or null to send the whole body.
 * A header that does not parse, or asks for several ranges, is ignored as the RFC allows; a
 * last byte past the end is cut to the end (a reader asking for 16 kB of a smaller file gets
 * what there is).
 */
export function byteRange(header: string | null, size: number): { start: number; end: number } | "unsatisfiable" | null {
  if (header === null) return null;
  const match = /^\s*bytes\s*=\s*(\d*)\s*-\s*(\d*)\s*$/i.exec(header);
  if (!match) return null;
  const [, first, last] = match;
  if (first === "" && last === "") return null;
  if (first === "") {
    const suffix = Number(last);
    if (suffix === 0 || size === 0) return "unsatisfiable";
    return { start: Math.max(0, size - suffix), end: size - 1 };
  }
  const start = Number(first);
  if (start >= size) return "unsatisfiable";
  if (last === "") return { start, end: size - 1 };
  const end = Number(last);
  if (end < start) return null;
  return { start, end: Math.min(end, size - 1) };
}
