import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { byteRange } from "./byte-range";

// Cases from RFC 9110 §14.1.2 (byte ranges) and §15.5.17 (416).
describe("byteRange", () => {
  it.each([
    ["bytes=0-499", 10_000, { start: 0, end: 499 }],
    ["bytes=500-999", 10_000, { start: 500, end: 999 }],
    ["bytes=-500", 10_000, { start: 9500, end: 9999 }],
    ["bytes=9500-", 10_000, { start: 9500, end: 9999 }],
    ["bytes=0-0", 10_000, { start: 0, end: 0 }],
    ["bytes=0-16383", 3000, { start: 0, end: 2999 }],
    ["bytes=-20000", 3000, { start: 0, end: 2999 }],
    ["BYTES = 10 - 20", 3000, { start: 10, end: 20 }],
  ])("%s of %d bytes", (header, size, want) => {
    expect(byteRange(header, size)).toEqual(want);
  });

  it.each([
    ["bytes=3000-", 3000],
    ["bytes=5000-6000", 3000],
    ["bytes=-0", 3000],
  ])("%s of %d bytes cannot be satisfied", (header, size) => {
    expect(byteRange(header, size)).toBe("unsatisfiable");
  });

  it.each([null, "", "bytes=", "bytes=-", "bytes=5-2", "bytes=0-1,5-6", "items=0-5", "bytes=a-b", "bytes=1.5-2"])(
    "ignores %j (send the whole body)",
    (header) => {
      expect(byteRange(header, 3000)).toBeNull();
    },
  );

  it("always answers a span inside the body, or none", () => {
    fc.assert(
      fc.property(fc.string(), fc.nat(1e9), (header, size) => {
        const r = byteRange(header, size);
        if (r && r !== "unsatisfiable") {
          expect(r.start).toBeGreaterThanOrEqual(0);
          expect(r.end).toBeLessThan(size);
          expect(r.start).toBeLessThanOrEqual(r.end);
        }
      }),
    );
    fc.assert(
      fc.property(fc.nat(1e9), fc.nat(1e9), fc.nat(1e9), (a, b, size) => {
        const r = byteRange(`bytes=${a}-${b}`, size);
        if (r && r !== "unsatisfiable") expect(r.end - r.start + 1).toBeLessThanOrEqual(b - a + 1);
      }),
    );
  });
});
