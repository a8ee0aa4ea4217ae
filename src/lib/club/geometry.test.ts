import { describe, expect, it } from "vitest";
import { boundaryFromCorners, MAX_CLAIM_POSITIONS, readBoundary } from "./geometry";

const square = [
  [0, 0],
  [1, 0],
  [1, 1],
  [0, 1],
  [0, 0],
];

describe("claim boundaries", () => {
  it("accepts a closed polygon, bare, as a Feature or in a FeatureCollection of one", () => {
    expect(readBoundary({ type: "Polygon", coordinates: [square] }).ok).toBe(true);
    expect(readBoundary({ type: "Feature", properties: {}, geometry: { type: "Polygon", coordinates: [square] } }).ok).toBe(true);
    expect(readBoundary({ type: "FeatureCollection", features: [{ type: "Feature", geometry: { type: "Polygon", coordinates: [square] } }] }).ok).toBe(true);
  });
  it("refuses an unclosed ring", () => {
    const r = readBoundary({
      type: "Polygon",
      coordinates: [
        [
          [0, 0],
          [1, 0],
          [1, 1],
          [0, 1],
        ],
      ],
    });
    expect(r).toEqual({ ok: false, message: expect.stringMatching(/not closed/) });
  });
  it("refuses a self-intersecting ring (a bow tie)", () => {
    const r = readBoundary({
      type: "Polygon",
      coordinates: [
        [
          [0, 0],
          [1, 1],
          [1, 0],
          [0, 1],
          [0, 0],
        ],
      ],
    });
    expect(r).toEqual({ ok: false, message: expect.stringMatching(/crosses itself/) });
  });
  it("refuses junk and positions out of range", () => {
    expect(readBoundary({ type: "Point", coordinates: [0, 0] }).ok).toBe(false);
    expect(
      readBoundary({
        type: "Polygon",
        coordinates: [
          [
            [0, 0],
            [200, 0],
            [1, 1],
            [0, 0],
          ],
        ],
      }).ok,
    ).toBe(false);
  });
  it("builds a closed ring from typed corners (latitude first)", () => {
    const r = boundaryFromCorners("41.80, -117.62\n41.80 -117.61\n41.81, -117.61\n41.81, -117.62");
    expect(r.ok && r.polygon.coordinates[0]).toEqual([
      [-117.62, 41.8],
      [-117.61, 41.8],
      [-117.61, 41.81],
      [-117.62, 41.81],
      [-117.62, 41.8],
    ]);
    expect(boundaryFromCorners("41.8, x").ok).toBe(false);
  });
});

describe("outline size (RELIABILITY 34: bounded work per request)", () => {
  const circle = (n: number) => {
    const ring = Array.from({ length: n }, (_, i) => [-117.6 + 0.01 * Math.cos((2 * Math.PI * i) / n), 41.8 + 0.01 * Math.sin((2 * Math.PI * i) / n)]);
    return { type: "Polygon", coordinates: [[...ring, ring[0]]] };
  };
  it("accepts an outline at the limit and refuses one past it, saying how many positions it had", () => {
    expect(readBoundary(circle(MAX_CLAIM_POSITIONS - 1)).ok).toBe(true);
    const refused = readBoundary(circle(20_000));
    expect(refused.ok).toBe(false);
    expect(!refused.ok && refused.message).toMatch(/20001 positions; at most 2000/);
  });
});

describe("refusals that name the problem (issue 18)", () => {
  it.each([
    [{ type: "Point", coordinates: [-117.6, 41.8] }, /not a point/],
    [
      {
        type: "LineString",
        coordinates: [
          [-117.6, 41.8],
          [-117.5, 41.8],
        ],
      },
      /closed area/,
    ],
    [{ type: "Polygon", coordinates: [] }, /empty/],
    [
      {
        type: "Polygon",
        coordinates: [
          [
            [41.8, -117.62],
            [41.8, -117.61],
            [41.81, -117.61],
            [41.8, -117.62],
          ],
        ],
      },
      /swapped/,
    ],
    [
      {
        type: "Polygon",
        coordinates: [
          [
            [-217.6, 41.8],
            [-117.61, 41.8],
            [-117.61, 41.81],
            [-217.6, 41.8],
          ],
        ],
      },
      /out of range/,
    ],
    [{ type: "Feature", geometry: null }, /no GeoJSON geometry/],
    [{ type: "Polygon", coordinates: [[["a", "b"]]] }, /pairs of numbers/],
  ])("%j", (input, message) => {
    const r = readBoundary(input);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.message).toMatch(message);
  });
});
