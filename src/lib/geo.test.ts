import { describe, expect, it } from "vitest";
import { claimAt, formatDecimal, toDms } from "./geo";

describe("toDms", () => {
  it("writes degrees, minutes and seconds with the hemisphere", () => {
    expect(toDms(41.8, "lat")).toBe("41° 48′ 0.0″ N");
    expect(toDms(-117.62, "lon")).toBe("117° 37′ 12.0″ W");
    expect(toDms(-33.8568, "lat")).toBe("33° 51′ 24.5″ S");
  });
  it("carries 59.96″ up to the next minute", () => {
    expect(toDms(10.999999, "lat")).toBe("11° 0′ 0.0″ N");
  });
});

describe("claimAt", () => {
  const square = {
    id: "a",
    name: "Square",
    boundary: {
      type: "Polygon" as const,
      coordinates: [
        [
          [0, 0],
          [1, 0],
          [1, 1],
          [0, 1],
          [0, 0],
        ],
      ],
    },
  };
  it("finds the claim holding a point, and none outside", () => {
    expect(claimAt(0.5, 0.5, [square])?.id).toBe("a");
    expect(claimAt(1.5, 0.5, [square])).toBeUndefined();
    expect(claimAt(0.5, 0.5, [{ ...square, active: false }])).toBeUndefined();
  });
  it("leaves out a hole in the boundary, and looks in every part of a multi-part claim", () => {
    const hole = [
      [0.4, 0.4],
      [0.6, 0.4],
      [0.6, 0.6],
      [0.4, 0.6],
      [0.4, 0.4],
    ];
    const holed = { ...square, boundary: { type: "Polygon" as const, coordinates: [...square.boundary.coordinates, hole] } };
    expect(claimAt(0.5, 0.5, [holed])).toBeUndefined();
    expect(claimAt(0.2, 0.2, [holed])?.id).toBe("a");
    const parts = {
      ...square,
      boundary: {
        type: "MultiPolygon" as const,
        coordinates: [
          square.boundary.coordinates,
          [
            [
              [5, 5],
              [6, 5],
              [6, 6],
              [5, 6],
              [5, 5],
            ],
          ],
        ],
      },
    };
    expect(claimAt(5.5, 5.5, [parts])?.id).toBe("a");
    expect(claimAt(3, 3, [parts])).toBeUndefined();
    // A real claim's shape: a point inside its concave notch is outside the claim.
    const notched = {
      ...square,
      boundary: {
        type: "Polygon" as const,
        coordinates: [
          [
            [0, 0],
            [2, 0],
            [2, 2],
            [1, 1],
            [0, 2],
            [0, 0],
          ],
        ],
      },
    };
    expect(claimAt(1.8, 1, [notched])).toBeUndefined();
    expect(claimAt(0.5, 1, [notched])?.id).toBe("a");
  });
});

describe("formatDecimal", () => {
  it("shows five places (about 1 m, finer than a phone's fix), rounding rather than cutting", () => {
    expect(formatDecimal(41.7929494, -117.6122161)).toBe("41.79295, -117.61222");
    expect(formatDecimal(0, 0)).toBe("0.00000, 0.00000");
  });
});
