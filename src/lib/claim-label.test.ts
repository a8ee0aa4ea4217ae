import { describe, expect, it } from "vitest";
import { claimLabelAnchor } from "./claim-label";

describe("claimLabelAnchor", () => {
  it("hangs the label over a turned claim's northernmost point, centred on its width", () => {
    const ring = [
      [-117.62, 41.799],
      [-117.615, 41.8],
      [-117.616, 41.802],
      [-117.621, 41.8005],
      [-117.62, 41.799],
    ];
    expect(claimLabelAnchor({ type: "Polygon", coordinates: [ring] })).toEqual([-117.618, 41.802]);
  });

  it("takes every part of a claim in several pieces, and ignores holes", () => {
    const square = (w: number, s: number, size: number) => [
      [w, s],
      [w + size, s],
      [w + size, s + size],
      [w, s + size],
      [w, s],
    ];
    const anchor = claimLabelAnchor({
      type: "MultiPolygon",
      coordinates: [[square(0, 0, 1), square(0.2, 0.2, 2)], [square(3, 0.5, 1)]],
    });
    expect(anchor).toEqual([2, 1.5]);
  });

  it("has no place for a claim without a boundary", () => {
    expect(claimLabelAnchor(null)).toBeNull();
    expect(claimLabelAnchor({ type: "Polygon", coordinates: [[]] })).toBeNull();
  });
});
