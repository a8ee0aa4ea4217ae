import { describe, expect, it } from "vitest";
import { weighMismatch } from "./fine-basis";

describe("a weigh-in far from the find's recorded weight", () => {
  it("is flagged past a tenth of the weight (or 0.05 g on small finds), not within it", () => {
    expect(weighMismatch(12, [84.1, 84.1])).toBe(true); // the seven-times case
    expect(weighMismatch(84.2, [84.1, 84.12])).toBe(false);
    expect(weighMismatch(10, [11.2])).toBe(true);
    expect(weighMismatch(10, [10.9])).toBe(false);
    expect(weighMismatch(0.3, [0.34])).toBe(false);
    expect(weighMismatch(0.3, [0.36])).toBe(true);
    expect(weighMismatch(null, [5])).toBe(false);
    expect(weighMismatch(5, [])).toBe(false);
  });
});
