import { describe, expect, it } from "vitest";
import { planOutlines } from "./outline-plan";

// A square of 0.01° at latitude 60°: 0.01° of latitude is about 1113 m, 0.01° of longitude half that
// (cos 60° = 0.5), so the square is drawn twice as tall as wide.
const square = (lon: number, lat: number, d = 0.01) => ({
  type: "Polygon" as const,
  coordinates: [
    [
      [lon, lat],
      [lon + d, lat],
      [lon + d, lat + d],
      [lon, lat + d],
      [lon, lat],
    ],
  ],
});

describe("claim outlines on a flat plan", () => {
  it("keeps the ground's proportions at the outlines' latitude, north up", () => {
    const plan = planOutlines([{ id: "a", boundary: square(10, 60) }], 800);
    expect(plan.height).toBe(600); // tall shape: height capped at three quarters of the width
    const nums = plan.claims[0].path.match(/-?\d+(\.\d+)?/g)!.map(Number);
    const xs = nums.filter((_, i) => i % 2 === 0);
    const ys = nums.filter((_, i) => i % 2 === 1);
    const w = Math.max(...xs) - Math.min(...xs);
    const h = Math.max(...ys) - Math.min(...ys);
    expect(h / w).toBeCloseTo(2, 1);
    // The first corner is the south-west one: lowest on the plan (largest y).
    expect(ys[0]).toBe(Math.max(...ys));
    expect(plan.claims[0].label.x).toBeCloseTo((Math.max(...xs) + Math.min(...xs)) / 2, 0);
  });

  it("puts each label under its outline, or over it near the plan's foot, never on it", () => {
    const plan = planOutlines(
      [
        { id: "north", boundary: square(-120.5, 39.25, 0.005) },
        { id: "south", boundary: square(-120.5, 39.2, 0.005) },
      ],
      800,
    );
    const ysOf = (id: string) =>
      plan.claims
        .find((c) => c.id === id)!
        .path.match(/-?\d+(\.\d+)?/g)!
        .map(Number)
        .filter((_, i) => i % 2 === 1);
    const north = plan.claims.find((c) => c.id === "north")!.label;
    const south = plan.claims.find((c) => c.id === "south")!.label;
    expect(north).toMatchObject({ above: false, y: Math.max(...ysOf("north")) });
    expect(south).toMatchObject({ above: true, y: Math.min(...ysOf("south")) });
  });

  it("fits every claim inside the plan with a margin, and leaves out claims with no outline", () => {
    const plan = planOutlines(
      [
        { id: "a", boundary: square(-120.5, 39.2) },
        { id: "b", boundary: square(-120.47, 39.21, 0.02) },
        { id: "c", boundary: null },
      ],
      600,
    );
    expect(plan.claims.map((c) => c.id)).toEqual(["a", "b"]);
    for (const c of plan.claims) {
      const nums = c.path.match(/-?\d+(\.\d+)?/g)!.map(Number);
      nums.forEach((v, i) => {
        expect(v).toBeGreaterThanOrEqual(0.08 * (i % 2 === 0 ? 600 : plan.height) - 0.1);
        expect(v).toBeLessThanOrEqual((1 - 0.08) * (i % 2 === 0 ? 600 : plan.height) + 0.1);
      });
    }
  });

  it("draws every polygon of a MultiPolygon and labels the largest", () => {
    const small = square(5, 45, 0.001).coordinates;
    const big = square(5.01, 45, 0.01).coordinates;
    const plan = planOutlines([{ id: "m", boundary: { type: "MultiPolygon", coordinates: [small, big] } }]);
    expect(plan.claims[0].path.match(/M/g)).toHaveLength(2);
    const xs = plan.claims[0].path
      .match(/-?\d+(\.\d+)?/g)!
      .map(Number)
      .filter((_, i) => i % 2 === 0);
    expect(plan.claims[0].label.x).toBeGreaterThan((Math.min(...xs) + Math.max(...xs)) / 2); // the big one is east
  });

  it("gives a scale bar of a round length, true to the ground", () => {
    // 0.01° of latitude = 1113.2 m (111 320 m per degree, WGS 84 mean: common practice).
    const plan = planOutlines([{ id: "a", boundary: square(0, 0) }], 800);
    const unitsPerMetre = plan.scale!.length / plan.scale!.metres;
    const ys = plan.claims[0].path
      .match(/-?\d+(\.\d+)?/g)!
      .map(Number)
      .filter((_, i) => i % 2 === 1);
    expect((Math.max(...ys) - Math.min(...ys)) / unitsPerMetre).toBeCloseTo(1113.2, -1);
    expect([10, 20, 50, 100, 200, 500, 1000, 2000, 5000]).toContain(plan.scale!.metres);
  });

  it("lays out more positions than a function call can take as arguments", () => {
    // 80 claims at the 2000-position limit each: 160 000 positions.
    const ring = Array.from({ length: 1999 }, (_, i) => [10 + 0.01 * Math.cos((i / 1999) * 2 * Math.PI), 45 + 0.01 * Math.sin((i / 1999) * 2 * Math.PI)]);
    const claims = Array.from({ length: 80 }, (_, i) => ({
      id: `c${i}`,
      boundary: { type: "Polygon" as const, coordinates: [[...ring.map(([x, y]) => [x + i * 0.03, y]), [ring[0][0] + i * 0.03, ring[0][1]]]] },
    }));
    const plan = planOutlines(claims);
    expect(plan.claims).toHaveLength(80);
    expect(plan.claims.every((c) => Number.isFinite(c.label.x) && Number.isFinite(c.label.y))).toBe(true);
  });

  it("has nothing to draw without outlines", () => {
    expect(planOutlines([{ id: "a", boundary: null }]).claims).toEqual([]);
  });
});
