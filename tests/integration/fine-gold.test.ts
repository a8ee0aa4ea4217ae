import fc from "fast-check";
import { v7 as uuidv7 } from "uuid";
import { beforeAll, describe, expect, it } from "vitest";
import { PUT as putProfile } from "@/app/api/club/claims/[id]/profile/route";
import { POST as postRefigure } from "@/app/api/club/claims/[id]/refigure/route";
import { estimateSpecimen } from "@/lib/estimate";
import type { Db } from "@/server/db";
import { resetLimits } from "@/server/limits";
import { newFind, push } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

let db: Db;
let member: string;
let officer: string;
let claims: { id: string; fineness: number; low: number; high: number }[];

beforeAll(async () => {
  ({ db } = await seededDatabase());
  member = await sessionCookie(memberByEmail(db, MEMBER_EMAIL));
  officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
  claims = db.$client.prepare("select id, fineness, fineness_low low, fineness_high high from claims order by name").all() as typeof claims;
});

type Kept = { basis: string | null; fine: number | null; low: number | null; high: number | null; mismatch: number };
const kept = (id: string) =>
  db.$client
    .prepare("select fine_basis basis, latest_fine_grams fine, latest_fine_low low, latest_fine_high high, weigh_mismatch mismatch from finds where id = ?")
    .get(id) as Kept;

let client = uuidv7();
let next = 1;
async function send(name: string, args: unknown) {
  const res = await push(member, client, [{ id: next++, name, args }]);
  expect(res.status).toBe(200);
  return res.body.results[0];
}

function weighIn(findId: string, air: number, water: number) {
  const input = { method: "hanging" as const, airGrams: [air], waterGrams: [water] };
  return { id: uuidv7(), findId, input, deviceEstimate: estimateSpecimen(input), weighedAt: Date.now() };
}

describe("every find has a fine-gold figure, and says how it was reached (issue 15)", () => {
  it("a nugget on a claim: its weight at the claim's fineness, with the fineness's range", async () => {
    const c = claims[0];
    const f = { ...newFind(), kind: "nugget" as const, claimId: c.id, weightGrams: 10 };
    expect((await send("find.put", f)).status).toBe("applied");
    expect(kept(f.id)).toMatchObject({ basis: "claim_fineness", fine: (10 * c.fineness) / 1000, low: (10 * c.low) / 1000, high: (10 * c.high) / 1000 });
  });

  it("flakes off any claim: the club's fineness (825 ‰, 700–950; FINENESS_PRESETS 'natural')", async () => {
    const f = { ...newFind(), kind: "flakes" as const, claimId: null, weightGrams: 2 };
    await send("find.put", f);
    expect(kept(f.id)).toMatchObject({ basis: "club_fineness", fine: 1.65, low: 1.4, high: 1.9 });
  });

  it("a purity the member recorded wins over the claim's fineness", async () => {
    const f = { ...newFind(), kind: "nugget" as const, claimId: claims[0].id, weightGrams: 4, purity: 900 };
    await send("find.put", f);
    expect(kept(f.id)).toMatchObject({ basis: "recorded_purity", fine: 3.6, low: 3.6, high: 3.6 });
  });

  it("a specimen has a figure only once weighed; a weigh-in wins over fineness for any kind; deleting it goes back", async () => {
    const s = { ...newFind(), kind: "specimen" as const, claimId: claims[0].id, weightGrams: 80 };
    await send("find.put", s);
    expect(kept(s.id)).toMatchObject({ basis: null, fine: null });
    const w = weighIn(s.id, 80, 46);
    expect((await send("weighIn.put", w)).status).toBe("applied");
    const estimate = estimateSpecimen(w.input);
    expect(kept(s.id)).toMatchObject({
      basis: "weighed",
      fine: estimate.fineGoldGrams,
      low: estimate.range.fineGoldGrams[0],
      high: estimate.range.fineGoldGrams[1],
      mismatch: 0,
    });
    await send("weighIn.delete", { id: w.id });
    expect(kept(s.id)).toMatchObject({ basis: null, fine: null });
  });

  it("a weigh-in whose air reading is far from the find's recorded weight is flagged", async () => {
    const s = { ...newFind(), kind: "specimen" as const, weightGrams: 12 };
    await send("find.put", s);
    await send("weighIn.put", weighIn(s.id, 84, 50));
    expect(kept(s.id).mismatch).toBe(1);
    // The member corrects the find's weight: the flag clears.
    await send("find.put", { ...s, weightGrams: 84.2 });
    expect(kept(s.id).mismatch).toBe(0);
  });

  it("a weigh-in moved to another find leaves both finds' figures true", async () => {
    const a = { ...newFind(), kind: "specimen" as const, weightGrams: 60 };
    const b = { ...newFind(), kind: "specimen" as const, weightGrams: 60 };
    await send("find.put", a);
    await send("find.put", b);
    const w = weighIn(a.id, 60, 34);
    await send("weighIn.put", w);
    expect(kept(a.id).basis).toBe("weighed");
    await send("weighIn.put", { ...w, findId: b.id });
    expect(kept(a.id)).toMatchObject({ basis: null, fine: null });
    expect(kept(b.id).basis).toBe("weighed");
  });

  it("a new fineness changes later figures only, until an officer re-figures the season (audited)", async () => {
    const c = claims[1];
    const before = { ...newFind(), kind: "nugget" as const, claimId: c.id, weightGrams: 10, foundAt: Date.UTC(2026, 6, 1) };
    await send("find.put", before);
    const profile = {
      finenessLow: 880,
      finenessHigh: 920,
      finenessSource: "Melt of 2026-08: 212.4 g fine from 236.0 g",
      hostDensityLow: 2.62,
      hostDensityHigh: 2.68,
      hostDensitySource: "Club preset",
    };
    const res = await putProfile(
      req(`/api/club/claims/${c.id}/profile`, {
        method: "PUT",
        cookie: officer,
        headers: { "content-type": "application/json" },
        body: JSON.stringify(profile),
      }),
      { params: Promise.resolve({ id: c.id }) },
    );
    expect(res.status).toBe(200);
    expect((await res.json()).fineness).toBe(900);
    const after = { ...newFind(), kind: "nugget" as const, claimId: c.id, weightGrams: 10, foundAt: Date.UTC(2026, 6, 2) };
    await send("find.put", after);
    expect(kept(before.id).fine).toBe((10 * c.fineness) / 1000);
    expect(kept(after.id)).toMatchObject({ fine: 9, low: 8.8, high: 9.2 });
    // An edit that does not move the find keeps its figure's fineness.
    await send("find.put", { ...before, notes: "cleaned" });
    expect(kept(before.id).fine).toBe((10 * c.fineness) / 1000);
    const refigure = await postRefigure(
      req(`/api/club/claims/${c.id}/refigure`, {
        method: "POST",
        cookie: officer,
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ season: 2026 }),
      }),
      { params: Promise.resolve({ id: c.id }) },
    );
    expect(refigure.status).toBe(200);
    expect((await refigure.json()).finds).toBeGreaterThanOrEqual(2);
    expect(kept(before.id).fine).toBe(9);
    const audit = db.$client.prepare("select action from audit_log where entity_id = ? order by rowid").all(c.id) as { action: string }[];
    expect(audit.map((a) => a.action)).toEqual(expect.arrayContaining(["claim.profile", "claim.refigure"]));
  });

  it("refuses a profile with its range upside down, no source, a host denser than rock, or a number as text", async () => {
    const c = claims[2];
    const put = (body: unknown) =>
      putProfile(req(`/x`, { method: "PUT", cookie: officer, headers: { "content-type": "application/json" }, body: JSON.stringify(body) }), {
        params: Promise.resolve({ id: c.id }),
      });
    const good = { finenessLow: 800, finenessHigh: 900, finenessSource: "Assays", hostDensityLow: 2.6, hostDensityHigh: 2.7, hostDensitySource: "Barren rock" };
    for (const [bad, field] of [
      [{ ...good, finenessLow: 950 }, "finenessLow"],
      [{ ...good, finenessSource: "" }, "finenessSource"],
      [{ ...good, hostDensityHigh: 9.5 }, "hostDensityHigh"],
      [{ ...good, finenessHigh: "900" }, "finenessHigh"],
    ] as const) {
      const res = await put(bad);
      expect(res.status).toBe(400);
      expect(Object.keys((await res.json()).error.fields)).toContain(field);
    }
  });
});

describe("figures kept on the find equal a recomputation after any sequence of changes (RELIABILITY 40)", () => {
  // A find's figure worked out again from the records, not from the kept columns.
  const BY_HAND = `select f.id,
      coalesce((select w.fine_gold_grams from weigh_ins w where w.find_id = f.id and w.deleted_at is null order by w.weighed_at desc, w.id desc limit 1),
        case when f.kind = 'specimen' or f.weight_grams is null then null
             when f.purity is not null then f.weight_grams * f.purity / 1000.0
             else f.weight_grams * coalesce((select c.fineness from claims c where c.id = f.claim_id), 825) / 1000.0 end) as fine
    from finds f where f.member_id = ? and f.deleted_at is null`;

  it("random finds, edits, moves, weigh-ins and deletes", async () => {
    const memberId = memberByEmail(db, MEMBER_EMAIL).id;
    // Claims keep their fineness through this test, so "as it stood then" is "as it stands".
    const steady = claims.slice(2);
    const op = fc.oneof(
      fc.record({
        t: fc.constant("find" as const),
        slot: fc.nat(5),
        kind: fc.constantFrom("nugget", "specimen", "flakes", "fines", "crystalline"),
        weight: fc.option(fc.integer({ min: 1, max: 5000 }).map((n) => n / 10)),
        purity: fc.option(fc.integer({ min: 500, max: 1000 })),
        claim: fc.option(fc.nat(steady.length - 1)),
      }),
      fc.record({ t: fc.constant("weigh" as const), slot: fc.nat(5), w: fc.nat(3), air: fc.integer({ min: 200, max: 2000 }).map((n) => n / 10) }),
      fc.record({ t: fc.constant("unweigh" as const), w: fc.nat(3) }),
      fc.record({ t: fc.constant("delete" as const), slot: fc.nat(5) }),
    );
    await fc.assert(
      fc.asyncProperty(fc.array(op, { minLength: 1, maxLength: 25 }), async (ops) => {
        resetLimits(); // one push per change here, far past a member's rate
        client = uuidv7();
        next = 1;
        const slots = Array.from({ length: 6 }, () => ({ ...newFind(), purity: null as number | null }));
        const weighIns = Array.from({ length: 4 }, () => uuidv7());
        for (const o of ops) {
          if (o.t === "find") {
            Object.assign(slots[o.slot], { kind: o.kind, weightGrams: o.weight, purity: o.purity, claimId: o.claim === null ? null : steady[o.claim].id });
            await send("find.put", slots[o.slot]);
          } else if (o.t === "weigh") {
            const w = weighIn(slots[o.slot].id, o.air, o.air * 0.6);
            await send("weighIn.put", { ...w, id: weighIns[o.w] });
          } else if (o.t === "unweigh") await send("weighIn.delete", { id: weighIns[o.w] });
          else {
            await send("find.delete", { id: slots[o.slot].id });
            slots[o.slot] = { ...newFind(), purity: null };
          }
        }
        const byHand = db.$client.prepare(BY_HAND).all(memberId) as { id: string; fine: number | null }[];
        for (const r of byHand) expect(kept(r.id).fine, r.id).toBe(r.fine);
      }),
      { numRuns: 60 },
    );
  });
});

describe("the rule lives in one place", () => {
  it("the database's triggers are exactly the rule's text in db/fine-figure.ts", async () => {
    const { figureTriggersSql } = await import("@/server/db/fine-figure");
    const norm = (s: string) => s.replace(/\s+/g, " ").trim();
    const inDb = (
      db.$client.prepare("select sql from sqlite_master where type = 'trigger' and name like 'finds_figure%' order by name").all() as { sql: string }[]
    ).map((r) => norm(r.sql));
    expect(inDb).toEqual(figureTriggersSql().map(norm).sort());
  });

  it("the ledger's totals read its covering index, never the table", () => {
    const plan = db.$client
      .prepare(
        "explain query plan select count(*), sum(weight_grams), sum(latest_fine_grams), sum(latest_fine_low), sum(latest_fine_high), sum(weigh_mismatch) from finds where deleted_at is null and found_at >= ? and found_at < ?",
      )
      .all(0, 1) as { detail: string }[];
    expect(plan.map((p) => p.detail).join(" ")).toMatch(/COVERING INDEX finds_ledger/);
  });
});
