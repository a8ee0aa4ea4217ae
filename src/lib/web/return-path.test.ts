import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { safeReturnPath } from "./return-path";

const ORIGIN = "https://club.example";

describe("safeReturnPath (RELIABILITY 35: return paths stay on this origin)", () => {
  it.each([
    ["/finds", "/finds"],
    ["/club/ledger?season=2026#top", "/club/ledger?season=2026#top"],
    ["/finds/view#id=0190", "/finds/view#id=0190"],
  ])("keeps the same-site path %s", (from, want) => {
    expect(safeReturnPath(from, ORIGIN)).toBe(want);
  });

  it.each([
    "//evil.example",
    "/\\evil.example",
    "\\/evil.example",
    "/\t/evil.example",
    "/\n/evil.example",
    "/\r\n//evil.example",
    "/ /evil.example",
    "/\u00a0/evil.example",
    "/\u2028x",
    "/\u202eevil",
    "https://evil.example/",
    "http:/evil.example",
    "javascript:alert(1)",
    "evil.example",
    "",
    "/".padEnd(600, "a"),
  ])("refuses %j", (from) => {
    expect(safeReturnPath(from, ORIGIN)).toBe("/");
  });

  it("refuses what is not a string", () => {
    for (const v of [undefined, null, 5, ["/finds"], { toString: () => "/finds" }]) expect(safeReturnPath(v, ORIGIN)).toBe("/");
  });

  it("never throws and always answers a path on this origin, whatever the input", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary", maxLength: 80 }), (s) => {
        for (const from of [s, `/${s}`, `//${s}`, `/\\${s}`]) {
          const out = safeReturnPath(from, ORIGIN);
          expect(out.startsWith("/")).toBe(true);
          expect(out.startsWith("//")).toBe(false);
          expect(new URL(out, ORIGIN).origin).toBe(ORIGIN);
        }
      }),
      { numRuns: 2000 },
    );
  });
});
