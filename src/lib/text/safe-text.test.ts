import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { toSafeCsv, withoutBidiControls } from "./safe-text";

describe("CSV that is safe to open (RELIABILITY 37; OWASP CSV Injection)", () => {
  const hostile = ['=HYPERLINK("https://evil.example","click")', "+cmd|' /C calc'!A0", "-2+3", "@SUM(A1:A9)", "\t=1+1", "\r=1+1", "=1"];

  it.each(hostile)("neutralises %j so it reads back as the same text, not a formula", (cell) => {
    const csv = toSafeCsv(["memberName", "claimName"], [[cell, cell]]);
    const [, row] = Papa.parse<string[]>(csv).data;
    for (const value of row) {
      expect(value.startsWith("'")).toBe(true);
      expect(value.slice(1)).toBe(cell);
    }
  });

  it("leaves plain numbers, negative ones included, and ordinary text alone", () => {
    const csv = toSafeCsv(["a", "b", "c", "d", "e"], [[-1.5, "-12.25", "+3", "Lower Larkspur", "1e-3"]]);
    expect(Papa.parse<string[]>(csv).data[1]).toEqual(["-1.5", "-12.25", "+3", "Lower Larkspur", "1e-3"]);
  });

  it("removes bidirectional controls from text", () => {
    const name = "Ana\u202eedoc\u202c Ruiz\u2066x\u2069\u200f";
    expect(withoutBidiControls(name)).toBe("Anaedoc Ruizx");
    expect(Papa.parse<string[]>(toSafeCsv(["n"], [[name]])).data[1][0]).toBe("Anaedoc Ruizx");
  });
});
