import { v7 as uuidv7 } from "uuid";
import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { GET as barrenRockGet } from "@/app/api/club/barren-rock/route";
import { PUT as profilePut } from "@/app/api/club/claims/[id]/profile/route";
import { judgeSetupCheck, measureDensity, type DensityInput } from "@/lib/estimate/setup-check";
import type { Db } from "@/server/db";
import { resetLimits } from "@/server/limits";
import { newFind, newWeighIn, pullAll, push } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, OTHER_MEMBER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

// Tanaka et al., Metrologia 38 (2001) 301: water at 20 °C is 998.2067 kg/m³ (its check value).
const RHO_W_20 = 0.9982067;

let db: Db;
let member: string;
let other: string;
let officer: string;
let claimId: string;
let otherClaimId: string;

beforeAll(async () => {
  ({ db } = await seededDatabase());
  member = await sessionCookie(memberByEmail(db, MEMBER_EMAIL));
  other = await sessionCookie(memberByEmail(db, OTHER_MEMBER_EMAIL));
  officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
  const claims = db.$client.prepare("select id from claims order by name").all() as { id: string }[];
  claimId = claims[0].id;
  otherClaimId = claims[1].id;
});
beforeEach(() => resetLimits());

/** The textbook reading (no air correction, 20 °C) of a piece with the given readings. */
const textbook = (air: number, water: number): DensityInput => ({
  method: "hanging",
  airGrams: [air],
  waterGrams: [water],
  waterTempC: 20,
  airBuoyancyCorrection: false,
});
const piece = (input: DensityInput, weighedAt: number, claim = claimId) => ({
  id: uuidv7(),
  claimId: claim,
  input,
  deviceDensity: measureDensity(input).density,
  weighedAt,
  scaleId: null,
  scaleCheck: null,
  notes: "",
});

describe("barren rock: a claim's host density from its pieces", () => {
  it("proposes the pieces' mean ± 2 SD, checked by hand, and the officer's acceptance reaches the claim and members' devices", async () => {
    // Six pieces of vein quartz on the member's scale, textbook readings at 20 °C.
    const readings: [number, number][] = [
      [52.31, 32.58],
      [47.9, 29.84],
      [61.05, 38.02],
      [39.77, 24.74],
      [55.4, 34.47],
      [44.12, 27.5],
    ];
    const pieces = readings.map(([a, w], i) => piece(textbook(a, w), Date.UTC(2026, 7, 1 + i, 17)));
    // Not counted: another claim, another season, and a piece deleted again.
    const elsewhere = piece(textbook(50, 30), Date.UTC(2026, 7, 2), otherClaimId);
    const lastSeason = piece(textbook(50, 30), Date.UTC(2025, 7, 2));
    const removed = piece(textbook(50, 20), Date.UTC(2026, 7, 9));
    const muts = [...pieces, elsewhere, lastSeason, removed].map((p, i) => ({ id: i + 1, name: "barrenRock.put", args: p }));
    muts.push({ id: muts.length + 1, name: "barrenRock.delete", args: { id: removed.id } as never });
    const res = await push(member, uuidv7(), muts);
    expect(res.body.results.every((r) => r.status === "applied")).toBe(true);

    // By hand: ρ = A·ρw/(A − W); mean; sample SD (n − 1); ± max(2 SD, 0.02), outward to 0.001.
    const densities = readings.map(([a, w]) => (a * RHO_W_20) / (a - w));
    const mean = densities.reduce((s, d) => s + d, 0) / densities.length;
    const sd = Math.sqrt(densities.reduce((s, d) => s + (d - mean) ** 2, 0) / (densities.length - 1));
    const half = Math.max(2 * sd, 0.02);

    const answer = await barrenRockGet(req(`/api/club/barren-rock?claimId=${claimId}&season=2026`, { cookie: officer }), {} as never);
    expect(answer.status).toBe(200);
    const body = (await answer.json()) as {
      pieces: { density: number }[];
      proposal: { value: number; low: number; high: number; pieces: number; mean: number; sd: number };
    };
    expect(body.pieces).toHaveLength(6);
    body.pieces.forEach((p, i) => expect(p.density).toBeCloseTo(densities[i], 5));
    expect(body.proposal.pieces).toBe(6);
    expect(body.proposal.mean).toBeCloseTo(mean, 5);
    expect(body.proposal.sd).toBeCloseTo(sd, 5);
    expect(Math.abs(body.proposal.low - (mean - half))).toBeLessThan(0.0011);
    expect(Math.abs(body.proposal.high - (mean + half))).toBeLessThan(0.0011);
    expect(body.proposal.value).toBeCloseTo((body.proposal.low + body.proposal.high) / 2, 12);

    // The officer accepts it through the claim's profile, as the claims page does.
    const before = db.$client.prepare("select fineness_low l, fineness_high h, fineness_source s from claims where id = ?").get(claimId) as {
      l: number;
      h: number;
      s: string;
    };
    const put = await profilePut(
      req(`/api/club/claims/${claimId}/profile`, {
        method: "PUT",
        cookie: officer,
        headers: { "content-type": "application/json" },
        body: JSON.stringify({
          finenessLow: before.l,
          finenessHigh: before.h,
          finenessSource: before.s,
          hostDensityLow: body.proposal.low,
          hostDensityHigh: body.proposal.high,
          hostDensitySource: "Barren-rock weigh-ins of 2026",
        }),
      }),
      { params: Promise.resolve({ id: claimId }) },
    );
    expect(put.status).toBe(200);
    const row = db.$client.prepare("select host_density d, host_density_low l, host_density_high h from claims where id = ?").get(claimId) as {
      d: number;
      l: number;
      h: number;
    };
    expect(row).toEqual({ d: body.proposal.value, l: body.proposal.low, h: body.proposal.high });
    const { changes } = await pullAll(member, uuidv7());
    const claim = changes.find((c) => c.entity === "claim" && c.op === "put" && c.value.id === claimId);
    expect(claim && claim.op === "put" && claim.value.hostDensity).toBe(body.proposal.value);
    // The member's own pieces come back to their devices too.
    expect(changes.filter((c) => c.entity === "barrenRock" && c.op === "put")).toHaveLength(8);
  });

  it("refuses a piece on an unknown claim, and proposes nothing from fewer than five pieces", async () => {
    const res = await push(member, uuidv7(), [{ id: 1, name: "barrenRock.put", args: piece(textbook(50, 30), Date.UTC(2026, 7, 1), uuidv7()) }]);
    expect(res.body.results[0]).toMatchObject({ status: "rejected", reason: "unknown_claim" });
    const answer = await barrenRockGet(req(`/api/club/barren-rock?claimId=${otherClaimId}&season=2026`, { cookie: officer }), {} as never);
    expect(((await answer.json()) as { proposal: unknown }).proposal).toBeNull();
  });
});

describe("weigh-ins on a checked scale", () => {
  const reference = { kind: "copper" as const, label: "Copper slug", density: 8.96, uncertainty: 0.02 };
  const check = (water: number, checkedAt: number) => {
    const input = { method: "hanging" as const, airGrams: [50], waterGrams: [water] };
    return { id: uuidv7(), checkedAt, reference, input, result: judgeSetupCheck(input, reference) };
  };
  const scale = (checks: ReturnType<typeof check>[]) => ({ id: uuidv7(), name: "Pocket scale", stepGrams: 0.01, accuracyGrams: null, checks });
  const checkedFlag = (findId: string) => (db.$client.prepare("select weighed_scale_checked c from finds where id = ?").get(findId) as { c: number | null }).c;

  it("keeps weighed_scale_checked on the find: 1 on a scale whose latest check passed, 0 when it failed, null unweighed", async () => {
    // 50 g of copper (8.96) hangs at 44.42 g in water at 20 °C; 44.52 g is a basket touching the cup.
    const good = check(44.42, Date.UTC(2026, 6, 1));
    const bad = check(44.52, Date.UTC(2026, 6, 2));
    expect(good.result.passed).toBe(true);
    expect(bad.result.passed).toBe(false);
    const sound = scale([good]);
    const faulty = scale([good, bad]);
    const [f1, f2, f3] = [newFind(), newFind(), newFind()];
    const ref = (c: typeof good) => ({ id: c.id, passed: c.result.passed, checkedAt: c.checkedAt });
    const res = await push(member, uuidv7(), [
      { id: 1, name: "scale.put", args: sound },
      { id: 2, name: "scale.put", args: faulty },
      { id: 3, name: "find.put", args: f1 },
      { id: 4, name: "find.put", args: f2 },
      { id: 5, name: "find.put", args: f3 },
      { id: 6, name: "weighIn.put", args: { ...newWeighIn(f1.id), scaleId: sound.id, scaleCheck: ref(good) } },
      { id: 7, name: "weighIn.put", args: { ...newWeighIn(f2.id), scaleId: faulty.id, scaleCheck: ref(bad) } },
    ]);
    expect(res.body.results.map((r) => r.reason ?? r.status)).toEqual(Array(7).fill("applied"));
    expect(checkedFlag(f1.id)).toBe(1);
    expect(checkedFlag(f2.id)).toBe(0);
    expect(checkedFlag(f3.id)).toBeNull();
    const scales = db.$client.prepare("select id, latest_check_passed p from scales where id in (?, ?)").all(sound.id, faulty.id) as {
      id: string;
      p: number;
    }[];
    expect(Object.fromEntries(scales.map((s) => [s.id, s.p]))).toEqual({ [sound.id]: 1, [faulty.id]: 0 });
    // Officers see it in the ledger, row by row.
    const { ledgerPage } = await import("@/server/club/ledger");
    const { ledgerQuerySchema } = await import("@/lib/club/ledger");
    const rows = ledgerPage(ledgerQuerySchema.parse({ memberId: memberByEmail(db, MEMBER_EMAIL).id, pageSize: 200 })).rows;
    const of = (id: string) => rows.find((r) => r.id === id)?.scaleChecked;
    expect([of(f1.id), of(f2.id), of(f3.id)]).toEqual([true, false, null]);
  });

  it("takes the server's verdict, not the device's, and refuses another member's scale", async () => {
    const bad = check(44.52, Date.UTC(2026, 6, 3));
    const lying = { ...bad, result: { ...bad.result, passed: true } };
    const s = scale([lying]);
    const f = newFind();
    const res = await push(member, uuidv7(), [
      { id: 1, name: "scale.put", args: s },
      { id: 2, name: "find.put", args: f },
      { id: 3, name: "weighIn.put", args: { ...newWeighIn(f.id), scaleId: s.id, scaleCheck: { id: bad.id, passed: true, checkedAt: bad.checkedAt } } },
    ]);
    expect(res.body.results.map((r) => r.status)).toEqual(["applied", "applied", "applied"]);
    expect(checkedFlag(f.id)).toBe(0);
    const theirs = newFind();
    const refused = await push(other, uuidv7(), [
      { id: 1, name: "find.put", args: theirs },
      { id: 2, name: "weighIn.put", args: { ...newWeighIn(theirs.id), scaleId: s.id, scaleCheck: null } },
    ]);
    expect(refused.body.results[1]).toMatchObject({ status: "rejected", reason: "unknown_parent", field: "scaleId" });
  });
});

describe("deletions of scales and barren rock", () => {
  it("are purged after the keeping time, except a scale a weigh-in still names", async () => {
    const { purgeTombstones } = await import("@/server/sync/tombstones");
    const named = { id: uuidv7(), name: "Old scale", stepGrams: 0.1, accuracyGrams: null, checks: [] };
    const unnamed = { ...named, id: uuidv7(), name: "Spare scale" };
    const f = newFind();
    const p = piece(textbook(50, 30), Date.UTC(2026, 8, 1));
    const res = await push(member, uuidv7(), [
      { id: 1, name: "scale.put", args: named },
      { id: 2, name: "scale.put", args: unnamed },
      { id: 3, name: "find.put", args: f },
      { id: 4, name: "weighIn.put", args: { ...newWeighIn(f.id), scaleId: named.id, scaleCheck: null } },
      { id: 5, name: "barrenRock.put", args: p },
      { id: 6, name: "scale.delete", args: { id: named.id } },
      { id: 7, name: "scale.delete", args: { id: unnamed.id } },
      { id: 8, name: "barrenRock.delete", args: { id: p.id } },
    ]);
    expect(res.body.results.every((r) => r.status === "applied")).toBe(true);
    purgeTombstones(Date.now() + 1000, 0);
    const left = (table: string, id: string) => db.$client.prepare(`select count(*) n from ${table} where id = ?`).get(id) as { n: number };
    expect(left("scales", named.id).n).toBe(1);
    expect(left("scales", unnamed.id).n).toBe(0);
    expect(left("barren_rocks", p.id).n).toBe(0);
  });
});
