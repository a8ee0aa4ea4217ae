import fs from "node:fs";
import { describe, expect, it } from "vitest";

// Card and drop-area edges must be visible in sunlight: non-text contrast of at least 3:1
// against what they sit on (WCAG 2.1, success criterion 1.4.11; relative luminance and
// contrast ratio as WCAG 2.1 defines them).

const css = fs.readFileSync("src/app/globals.css", "utf8");

/** The custom properties of each theme block: the daylight root, and the camp-evening ones. */
function themes(): Record<string, string>[] {
  return [...css.matchAll(/(?:^|\n)\s*:root[^{]*\{([^}]*)\}/g)].map((m) =>
    Object.fromEntries([...m[1].matchAll(/--([a-z-]+):\s*(#[0-9a-f]{6})/gi)].map((v) => [v[1], v[2]])),
  );
}

function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
const contrast = (a: string, b: string) => {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
};

describe("edges visible in sunlight (WCAG 2.1 1.4.11)", () => {
  it("every theme's card edge is at least 3:1 against both the sheet and the paper", () => {
    const all = themes().filter((t) => t.edge);
    expect(all.length).toBe(3);
    for (const t of all) {
      expect(contrast(t.edge, t.sheet)).toBeGreaterThanOrEqual(3);
      expect(contrast(t.edge, t.paper)).toBeGreaterThanOrEqual(3);
    }
  });
  it("the ratio is computed as WCAG defines it: black on white is 21:1, the old rule colour on the sheet fails", () => {
    expect(contrast("#000000", "#ffffff")).toBeCloseTo(21, 5);
    expect(contrast("#c9bda3", "#fffdf7")).toBeLessThan(3);
  });
  it("cards and drop areas are drawn with the edge colour", () => {
    expect(css).toMatch(/\.sheet\s*\{[^}]*border:\s*1px solid var\(--edge\)/);
    for (const file of ["src/components/field/photo-drop.tsx", "src/components/field/photos-block.tsx", "src/components/club/claim-editor.tsx"]) {
      expect(fs.readFileSync(file, "utf8")).not.toMatch(/border-dashed[^"]*border-rule|"border-rule"/);
    }
  });
});
