import { v7 as uuidv7 } from "uuid";
import { beforeAll, describe, expect, it } from "vitest";
import { PUT as putClaim } from "@/app/api/club/claims/[id]/route";
import { GET as getLedger } from "@/app/api/club/ledger/route";
import type { Db } from "@/server/db";
import { newFind, push } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

type Claim = { id: string; name: string; kind: "placer" | "lode"; boundary: { type: "Polygon"; coordinates: number[][][] } };
let db: Db;
let member: string;
let officer: string;
let a: Claim;
let b: Claim;

/** The middle of a claim's outline (its corners' mean), which lies inside these rectangles. */
const middle = (c: Claim) => {
  const ring = c.boundary.coordinates[0].slice(0, -1);
  return { lon: ring.reduce((n, p) => n + p[0], 0) / ring.length, lat: ring.reduce((n, p) => n + p[1], 0) / ring.length };
};

beforeAll(async () => {
  ({ db } = await seededDatabase());
  member = await sessionCookie(memberByEmail(db, MEMBER_EMAIL));
  officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
  [a, b] = (db.$client.prepare("select id, name, kind, boundary from claims order by name").all() as (Omit<Claim, "boundary"> & { boundary: string })[]).map(
    (c) => ({ ...c, boundary: JSON.parse(c.boundary) }),
  );
});

const outside = (id: string) => (db.$client.prepare("select outside_claim o from finds where id = ?").get(id) as { o: number }).o;

describe("a find's claim follows its position (issue 15)", () => {
  it("flags a find recorded on one claim with a position inside another, not one inside its own or without a position", async () => {
    const wrong = { ...newFind(), claimId: a.id, ...middle(b), accuracyM: 5, locationSource: "device" as const };
    const right = { ...newFind(), claimId: a.id, ...middle(a), accuracyM: 5, locationSource: "device" as const };
    const nowhere = { ...newFind(), claimId: a.id, lat: null, lon: null };
    const res = await push(
      member,
      uuidv7(),
      [wrong, right, nowhere].map((f, i) => ({ id: i + 1, name: "find.put", args: f })),
    );
    expect(res.body.results.every((r) => r.status === "applied")).toBe(true);
    expect([outside(wrong.id), outside(right.id), outside(nowhere.id)]).toEqual([1, 0, 0]);
    const rows = (await (await getLedger(req(`/api/club/ledger?claimId=${a.id}&pageSize=200`, { cookie: officer }), { params: Promise.resolve({}) })).json())
      .rows as { id: string; outsideClaim: boolean }[];
    expect(rows.find((r) => r.id === wrong.id)!.outsideClaim).toBe(true);
    expect(rows.find((r) => r.id === right.id)!.outsideClaim).toBe(false);
    // The member moves it to the claim its position is in: no longer flagged.
    await push(member, uuidv7(), [{ id: 1, name: "find.put", args: { ...wrong, claimId: b.id } }]);
    expect(outside(wrong.id)).toBe(0);
  });

  it("a claim's new boundary re-checks its finds", async () => {
    const f = { ...newFind(), claimId: a.id, ...middle(a), accuracyM: 5, locationSource: "device" as const };
    await push(member, uuidv7(), [{ id: 1, name: "find.put", args: f }]);
    expect(outside(f.id)).toBe(0);
    // Move the claim's outline one whole claim-width east, away from the find.
    const ring = a.boundary.coordinates[0];
    const width = Math.max(...ring.map((p) => p[0])) - Math.min(...ring.map((p) => p[0]));
    const moved = { type: "Polygon", coordinates: [ring.map(([lon, lat]) => [lon + 2 * width, lat])] };
    const res = await putClaim(
      req(`/api/club/claims/${a.id}`, {
        method: "PUT",
        cookie: officer,
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ name: a.name, kind: a.kind, boundary: moved }),
      }),
      { params: Promise.resolve({ id: a.id }) },
    );
    expect(res.status).toBe(200);
    expect(outside(f.id)).toBe(1);
  });
});
