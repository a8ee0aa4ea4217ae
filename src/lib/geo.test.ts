import { describe, expect, it } from "vitest";
import { claimAt, toDms } from "./geo";

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
  const square = { id: "a", name: "Square", boundary: { type: "Polygon" as const, coordinates: [[[0, 0], [1, 0], [1, 1], [0, 1], [0, 0]]] } };
  it("finds the claim holding a point, and none outside", () => {
    expect(claimAt(0.5, 0.5, [square])?.id).toBe("a");
    expect(claimAt(1.5, 0.5, [square])).toBeUndefined();
    expect(claimAt(0.5, 0.5, [{ ...square, active: false }])).toBeUndefined();
  });
});
