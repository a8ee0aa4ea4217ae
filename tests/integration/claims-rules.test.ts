import { beforeAll, describe, expect, it } from "vitest";
import { POST as postClaim } from "@/app/api/club/claims/route";
import type { Db } from "@/server/db";
import { memberByEmail, OFFICER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

let db: Db;
let officer: string;
const none = { params: Promise.resolve({}) };
const create = async (body: Record<string, unknown>) => {
  const res = await postClaim(
    req("/api/club/claims", {
      method: "POST",
      cookie: officer,
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ kind: "placer", ...body }),
    }),
    none,
  );
  return { status: res.status, json: await res.json() };
};
// A square of side `d` degrees with its south-west corner at (lon, lat), far from the demo claims.
const square = (lon: number, lat: number, d = 0.002) => ({
  type: "Polygon",
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

beforeAll(async () => {
  ({ db } = await seededDatabase());
  officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
});

describe("claims the club can keep straight (issue 18)", () => {
  it("refuses a second claim of the same name, whatever its case and spaces", async () => {
    const existing = (db.$client.prepare("select name from claims limit 1").get() as { name: string }).name;
    const r = await create({ name: `  ${existing.toUpperCase()} ` });
    expect(r.status).toBe(409);
    expect(r.json.error.fields.name).toBeDefined();
  });

  it("accepts a claim beside another (a shared edge), warns of one overlapping it by name, and saves it once accepted", async () => {
    expect((await create({ name: "Test West", boundary: square(-110, 35) })).status).toBe(201);
    expect((await create({ name: "Test East", boundary: square(-109.998, 35) })).status).toBe(201);
    const overlapping = await create({ name: "Test Middle", boundary: square(-109.999, 35) });
    expect(overlapping.status).toBe(409);
    expect(overlapping.json.error.message).toMatch(/overlaps Test West \(about [\d,]+ m²\), Test East/);
    expect(db.$client.prepare("select count(*) n from claims where name = 'Test Middle'").get()).toEqual({ n: 0 });
    expect((await create({ name: "Test Middle", boundary: square(-109.999, 35), acceptOverlap: true })).status).toBe(201);
  });

  it("names the problem with an outline that is not an area", async () => {
    const r = await create({
      name: "Test Line",
      boundary: {
        type: "LineString",
        coordinates: [
          [-110, 36],
          [-109.9, 36],
        ],
      },
    });
    expect(r.status).toBe(400);
    expect(r.json.error.fields.boundary[0]).toMatch(/LineString.*closed area/);
  });
});
