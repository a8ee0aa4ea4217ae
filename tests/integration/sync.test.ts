import Database from "better-sqlite3";
import { v7 as uuidv7 } from "uuid";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { estimateSpecimen } from "@/lib/estimate";
import { ENGINE_VERSION } from "@/lib/estimate/version";
import type { Db } from "@/server/db";
import { databaseChecksum, MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, OTHER_MEMBER_EMAIL, seededDatabase, sessionCookie } from "../support/test-db";
import { applyChanges, newFind, newOuting, newWeighIn, pull, pullAll, push } from "../support/sync-client";

let db: Db;
let member: string;
let other: string;
let officer: string;
let memberId: string;

beforeEach(async () => {
  ({ db } = await seededDatabase());
  const m = memberByEmail(db, MEMBER_EMAIL);
  memberId = m.id;
  member = await sessionCookie(m);
  other = await sessionCookie(memberByEmail(db, OTHER_MEMBER_EMAIL));
  officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
});

const count = (sql: string, ...args: unknown[]) => (db.$client.prepare(sql).get(...args) as { n: number }).n;

/** Every sync test ends here: a device that pulls everything holds what the server holds. */
async function expectConverged(cookie: string, clientId: string, ownerId: string) {
  const { changes } = await pullAll(cookie, clientId);
  const device = applyChanges(changes);
  const serverFinds = db.$client.prepare("select id, weight_grams as w from finds where member_id = ? and deleted_at is null order by id").all(ownerId) as {
    id: string;
    w: number;
  }[];
  const deviceFinds = [...(device.get("find")?.values() ?? [])]
    .map((f) => ({ id: f.id as string, w: f.weightGrams as number }))
    .sort((a, b) => a.id.localeCompare(b.id));
  expect(deviceFinds).toEqual(serverFinds);
  const serverOutings = count("select count(*) n from outings where member_id = ? and deleted_at is null", ownerId);
  expect(device.get("outing")?.size ?? 0).toBe(serverOutings);
}

describe("push applies each change exactly once (RELIABILITY 1, 2, 4, 14)", () => {
  it("1: the same batch sent five times, in turn and at once, is applied once", async () => {
    const client = uuidv7();
    const o = newOuting();
    const f = newFind({ outingId: o.id });
    const batch = [
      { id: 1, name: "outing.put", args: o },
      { id: 2, name: "find.put", args: f },
      { id: 3, name: "weighIn.put", args: newWeighIn(f.id) },
    ];
    const first = await push(member, client, batch);
    expect(first.status).toBe(200);
    expect(first.body.results.map((r) => r.status)).toEqual(["applied", "applied", "applied"]);
    const after = databaseChecksum(db);
    await push(member, client, batch);
    const parallel = await Promise.all([1, 2, 3].map(() => push(member, client, batch)));
    for (const p of parallel) expect(p.body.results.every((r) => r.status === "skipped")).toBe(true);
    expect(databaseChecksum(db)).toBe(after);
    expect(count("select count(*) n from finds where id = ?", f.id)).toBe(1);
    await expectConverged(member, client, memberId);
  });

  it("2: a resend after a lost answer changes nothing, and the pull reports the id as applied", async () => {
    const client = uuidv7();
    const f = newFind();
    await push(member, client, [{ id: 1, name: "find.put", args: f }]); // the answer is "lost"
    const before = databaseChecksum(db);
    const resend = await push(member, client, [{ id: 1, name: "find.put", args: f }]);
    expect(resend.body).toMatchObject({ lastMutationId: 1, results: [{ id: 1, status: "skipped" }] });
    expect(databaseChecksum(db)).toBe(before);
    expect((await pull(member, client)).body.lastMutationId).toBe(1);
  });

  it("4: a gap is refused with the id to resend from; ids already seen are skipped", async () => {
    const client = uuidv7();
    const first = newFind();
    await push(member, client, [{ id: 1, name: "find.put", args: first }]);
    const gap = await push(member, client, [{ id: 3, name: "find.put", args: newFind() }]);
    expect(gap.status).toBe(409);
    expect(gap.body.error?.code).toBe("conflict:mutation_gap");
    expect(gap.body.error?.fields?.expected).toEqual(["2"]);
    // Id 1 resent as it was (a replay; other content under it is a reuse, see sync-wedge.test.ts).
    const mixed = await push(member, client, [
      { id: 1, name: "find.put", args: first },
      { id: 2, name: "find.put", args: newFind() },
    ]);
    expect(mixed.body.results.map((r) => r.status)).toEqual(["skipped", "applied"]);
  });

  it("14: many writes in one millisecond get distinct, increasing cursor values; a paged pull skips none", async () => {
    const client = uuidv7();
    const finds = Array.from({ length: 60 }, () => newFind());
    vi.spyOn(Date, "now").mockReturnValue(Date.UTC(2026, 6, 2));
    await push(
      member,
      client,
      finds.map((f, i) => ({ id: i + 1, name: "find.put", args: f })),
    );
    vi.restoreAllMocks();
    const seqs = db.$client
      .prepare("select seq from finds where member_id = ? order by seq")
      .all(memberId)
      .map((r) => (r as { seq: number }).seq);
    expect(new Set(seqs).size).toBe(seqs.length);
    const { changes } = await pullAll(member, client, 0, 7);
    const got = new Set(changes.filter((c) => c.entity === "find").map((c) => (c.op === "put" ? c.value.id : c.id)));
    for (const f of finds) expect(got.has(f.id)).toBe(true);
  });
});

describe("bad changes and temporary trouble (RELIABILITY 5, 6)", () => {
  it("5: a permanently invalid change is rejected with its reason, the id advances, the rest applies", async () => {
    const client = uuidv7();
    const good = newFind();
    const res = await push(member, client, [
      { id: 1, name: "find.put", args: { ...newFind(), weightGrams: -1 } },
      { id: 2, name: "find.put", args: good },
    ]);
    expect(res.body.lastMutationId).toBe(2);
    expect(res.body.results[0]).toMatchObject({ status: "rejected", reason: "invalid", field: "weightGrams" });
    expect(res.body.results[1].status).toBe("applied");
    expect(count("select count(*) n from finds where id = ?", good.id)).toBe(1);
  });

  it("6: a busy database stops the batch without advancing; the retry succeeds", async () => {
    const client = uuidv7();
    const f = newFind();
    // A real lock: another connection holds the write lock past the server's busy timeout.
    const { databasePath, getDb } = await import("@/server/db");
    const other = new Database(databasePath());
    other.exec("begin immediate");
    getDb().$client.pragma("busy_timeout = 50");
    const busy = await push(member, client, [{ id: 1, name: "find.put", args: f }]);
    expect(busy.status).toBe(503);
    expect(busy.body.error?.code).toBe("unavailable:database");
    other.exec("rollback");
    other.close();
    getDb().$client.pragma("busy_timeout = 5000");
    expect(count("select count(*) n from finds where id = ?", f.id)).toBe(0);
    expect(db.$client.prepare("select count(*) n from sync_clients where id = ? and last_mutation_id > 0").get(client)).toEqual({ n: 0 });
    const retry = await push(member, client, [{ id: 1, name: "find.put", args: f }]);
    expect(retry.body.results[0].status).toBe("applied");
  });
});

describe("conflicts between one member's devices (RELIABILITY 10, 11, 15)", () => {
  it("10: the later arrival wins, the earlier version is kept in history, both devices converge", async () => {
    const phone = uuidv7();
    const tablet = uuidv7();
    const f = newFind({ weightGrams: 10 });
    await push(member, phone, [{ id: 1, name: "find.put", args: f }]);
    await push(member, tablet, [{ id: 1, name: "find.put", args: { ...f, weightGrams: 12 } }]);
    await push(member, phone, [{ id: 2, name: "find.put", args: { ...f, weightGrams: 11 } }]);
    expect(count("select count(*) n from record_history where entity_id = ?", f.id)).toBe(2);
    expect((db.$client.prepare("select weight_grams w from finds where id = ?").get(f.id) as { w: number }).w).toBe(11);
    await expectConverged(member, phone, memberId);
    await expectConverged(member, tablet, memberId);
  });

  it("11: an edit of a record deleted on another device is refused, and kept in history", async () => {
    const a = uuidv7();
    const b = uuidv7();
    const f = newFind();
    await push(member, a, [{ id: 1, name: "find.put", args: f }]);
    await push(member, a, [{ id: 2, name: "find.delete", args: { id: f.id } }]);
    const late = await push(member, b, [{ id: 1, name: "find.put", args: { ...f, notes: "edited offline" } }]);
    expect(late.body.results[0]).toMatchObject({ status: "rejected", reason: "deleted" });
    const kept = db.$client.prepare("select version from record_history where entity_id = ?").all(f.id) as { version: string }[];
    expect(kept.some((k) => JSON.parse(k.version).notes === "edited offline")).toBe(true);
    const { changes } = await pullAll(member, b);
    expect(applyChanges(changes).get("find")?.has(f.id) ?? false).toBe(false);
  });

  it("15: a device clock a year off changes neither order nor results", async () => {
    const client = uuidv7();
    const f = newFind();
    // The device's clock is a year ahead, so every time it writes is too; the server's own clock
    // (sessions, change numbers) is right. Arrival order decides, not the device's times.
    const yearAhead = Date.now() + 365 * 86_400_000;
    await push(member, client, [{ id: 1, name: "find.put", args: { ...f, foundAt: yearAhead } }]);
    await push(member, client, [{ id: 2, name: "find.put", args: { ...f, foundAt: yearAhead - 86_400_000, weightGrams: 50 } }]);
    expect((db.$client.prepare("select weight_grams w from finds where id = ?").get(f.id) as { w: number }).w).toBe(50);
  });
});

describe("pull (RELIABILITY 13, 16)", () => {
  it("13: a pull cut mid-page resumes from the stored cursor with no gap", async () => {
    const client = uuidv7();
    await push(
      member,
      client,
      Array.from({ length: 25 }, (_, i) => ({ id: i + 1, name: "find.put", args: newFind() })),
    );
    const first = await pull(member, client, 0, 10);
    // The second page's answer is "lost": the device asks again from the cursor it stored.
    await pull(member, client, first.body.cursor, 10);
    const rest = await pullAll(member, client, first.body.cursor, 10);
    const all = [...first.body.changes, ...rest.changes];
    expect(new Set(all.map((c) => c.seq)).size).toBe(all.length);
    await expectConverged(member, client, memberId);
  });

  it("16: a cursor beyond the server's (restored from an older backup) asks the device to reset", async () => {
    const res = await pull(member, uuidv7(), 10_000_000);
    expect(res.body.reset).toBe(true);
  });

  it("returns the claims, prices, own records and reviews of own finds, and deletions as tombstones", async () => {
    const client = uuidv7();
    const f = newFind();
    await push(member, client, [
      { id: 1, name: "find.put", args: f },
      { id: 2, name: "find.delete", args: { id: f.id } },
    ]);
    const { changes } = await pullAll(member, client);
    const entities = new Set(changes.map((c) => c.entity));
    for (const e of ["claim", "price", "find", "outing"]) expect(entities).toContain(e);
    expect(changes).toContainEqual(expect.objectContaining({ entity: "find", op: "del", id: f.id }));
  });
});

describe("ownership (RELIABILITY 23, 24, 26)", () => {
  it("23: changing another member's record, or owner and server fields, is refused and changes nothing", async () => {
    const client = uuidv7();
    const theirs = db.$client.prepare("select id from finds where member_id != ? limit 1").get(memberId) as { id: string };
    const before = databaseChecksum(db);
    const res = await push(member, client, [
      { id: 1, name: "find.put", args: { ...newFind(), id: theirs.id } },
      { id: 2, name: "find.put", args: { ...newFind(), memberId: "someone" } },
      { id: 3, name: "find.put", args: { ...newFind(), seq: 99 } },
      { id: 4, name: "find.delete", args: { id: theirs.id } },
    ]);
    expect(res.body.results.map((r) => r.status)).toEqual(["rejected", "rejected", "rejected", "rejected"]);
    expect(res.body.results[0].reason).toBe("not_owner");
    // Only the client's own bookkeeping moved.
    const strip = (s: string) =>
      s
        .split("\n")
        .filter((l) => !l.startsWith("sync_clients:") && !l.startsWith("sync_mutations:"))
        .join("\n");
    expect(strip(databaseChecksum(db))).toBe(strip(before));
  });

  it("24: a member's pull never holds another member's records; an officer may pull the club", async () => {
    const { changes } = await pullAll(member, uuidv7());
    for (const c of changes) if (c.op === "put" && "memberId" in c.value) expect(c.value.memberId).toBe(memberId);
    expect((await pull(member, uuidv7(), 0, 10, "club")).status).toBe(403);
    const club = await pull(officer, uuidv7(), 0, 2000, "club");
    const owners = new Set(
      club.body.changes.filter((c) => c.entity === "find" && c.op === "put").map((c) => (c as unknown as { value: { memberId: string } }).value.memberId),
    );
    expect(owners.size).toBeGreaterThan(3);
  });

  it("26: a push naming another member's client id is refused, and that client is unchanged", async () => {
    const client = uuidv7();
    await push(member, client, [{ id: 1, name: "find.put", args: newFind() }]);
    const res = await push(other, client, [{ id: 2, name: "find.put", args: newFind() }]);
    expect(res.status).toBe(403);
    expect((db.$client.prepare("select last_mutation_id l from sync_clients where id = ?").get(client) as { l: number }).l).toBe(1);
  });

  it("22: changes held for another member are never applied under the signed-in identity", async () => {
    const before = databaseChecksum(db);
    const res = await push(other, uuidv7(), [{ id: 1, name: "find.put", args: newFind() }], { asMember: memberId });
    expect(res.status).toBe(409);
    expect(res.body.error?.code).toBe("conflict:member");
    expect(databaseChecksum(db)).toBe(before);
  });

  it("refuses an anonymous push and an old protocol", async () => {
    expect((await push("", uuidv7(), [{ id: 1, name: "find.put", args: newFind() }])).status).toBe(401);
    expect((await push(member, uuidv7(), [{ id: 1, name: "find.put", args: newFind() }], { protocolVersion: 0 })).status).toBe(410);
  });
});

describe("weigh-ins", () => {
  it("are recomputed on the server with the engine; a device that disagrees is recorded", async () => {
    const client = uuidv7();
    const f = newFind();
    const honest = newWeighIn(f.id);
    const odd = { ...newWeighIn(f.id), deviceEstimate: { ...honest.deviceEstimate, fineGoldGrams: 99 } };
    await push(member, client, [
      { id: 1, name: "find.put", args: f },
      { id: 2, name: "weighIn.put", args: honest },
      { id: 3, name: "weighIn.put", args: odd },
    ]);
    const rows = db.$client.prepare("select id, mismatch, engine_version v, fine_gold_grams g from weigh_ins where find_id = ?").all(f.id) as {
      id: string;
      mismatch: number;
      v: string;
      g: number;
    }[];
    const byId = Object.fromEntries(rows.map((r) => [r.id, r]));
    expect(byId[honest.id]).toMatchObject({ mismatch: 0, v: honest.deviceEstimate.engineVersion, g: honest.deviceEstimate.fineGoldGrams });
    expect(byId[odd.id].mismatch).toBe(1);
    expect(byId[odd.id].g).toBe(honest.deviceEstimate.fineGoldGrams);
  });

  it("keep an older engine's device figure with its version beside the server's, made under the current one", async () => {
    const f = newFind();
    const w = newWeighIn(f.id);
    // As an engine 1.0.0 device sends it: a sentence in each warning, no assumptions.
    const { assumptions: _a, ...rest } = w.deviceEstimate;
    const older = { ...rest, engineVersion: "1.0.0", warnings: [{ code: "water_reading_drifts", message: "The in-water readings drift one way." }] };
    const res = await push(member, uuidv7(), [
      { id: 1, name: "find.put", args: f },
      { id: 2, name: "weighIn.put", args: { ...w, deviceEstimate: older } },
    ]);
    expect(res.body.results?.map((r: { status: string }) => r.status)).toEqual(["applied", "applied"]);
    const row = db.$client.prepare("select engine_version v, mismatch, device_estimate d, server_estimate s from weigh_ins where id = ?").get(w.id) as {
      v: string;
      mismatch: number;
      d: string;
      s: string;
    };
    expect(row.v).toBe(ENGINE_VERSION);
    expect(JSON.parse(row.s).engineVersion).toBe(ENGINE_VERSION);
    expect(JSON.parse(row.d).engineVersion).toBe("1.0.0");
    expect(row.mismatch).toBe(1);
  });

  it("take a nugget denser than its preset's finest gold, as an older engine saved it, held and warned", async () => {
    // About 18.9 g/cm³ (a 970 ‰ nugget) weighed under "natural gold" (700–950 ‰): engine 2.0.0
    // held it at all gold; the current engine does too, so the push is never refused for it.
    const f = newFind();
    const w = newWeighIn(f.id);
    const input = { ...w.input, airGrams: [100], waterGrams: [94.71] };
    const older = { ...estimateSpecimen(input), engineVersion: "2.0.0" };
    const res = await push(member, uuidv7(), [
      { id: 1, name: "find.put", args: f },
      { id: 2, name: "weighIn.put", args: { ...w, input, deviceEstimate: older } },
    ]);
    expect(res.body.results?.map((r: { status: string }) => r.status)).toEqual(["applied", "applied"]);
    const row = db.$client.prepare("select server_estimate s from weigh_ins where id = ?").get(w.id) as { s: string };
    const server = JSON.parse(row.s);
    expect(server.goldMassPercent).toBe(100);
    expect(server.warnings.map((x: { code: string }) => x.code)).toContain("denser_than_alloy");
  });

  it("go with their find when it comes in the same push, and not after it was deleted in that push", async () => {
    const f = newFind();
    const gone = newFind();
    const res = await push(member, uuidv7(), [
      { id: 1, name: "find.put", args: f },
      { id: 2, name: "weighIn.put", args: newWeighIn(f.id) },
      { id: 3, name: "find.put", args: gone },
      { id: 4, name: "find.delete", args: { id: gone.id } },
      { id: 5, name: "weighIn.put", args: newWeighIn(gone.id) },
    ]);
    expect(res.body.results?.map((r: { status: string; reason?: string }) => r.reason ?? r.status)).toEqual([
      "applied",
      "applied",
      "applied",
      "applied",
      "deleted",
    ]);
    const latest = db.$client.prepare("select latest_fine_grams g from finds where id = ?").get(f.id) as { g: number | null };
    expect(latest.g).not.toBeNull();
  });

  it("call a device figure equal only when every key and every bit agree", async () => {
    const client = uuidv7();
    const f = newFind();
    const base = newWeighIn(f.id);
    const e = base.deviceEstimate;
    // Keys in another order are the same figure; one key fewer, one more, or a density one ulp off is not.
    const reordered = Object.fromEntries(Object.entries(e).reverse());
    const { warnings: _w, ...lacking } = e;
    const extra = { ...e, note: null };
    const ulpOff = { ...e, specimenDensity: e.specimenDensity + e.specimenDensity * Number.EPSILON };
    expect(ulpOff.specimenDensity).not.toBe(e.specimenDensity);
    const cases = { reordered, lacking, extra, ulpOff };
    const ids: Record<string, string> = {};
    const mutations = [
      { id: 1, name: "find.put", args: f },
      ...Object.entries(cases).map(([k, deviceEstimate], i) => {
        const w = { ...newWeighIn(f.id), deviceEstimate };
        ids[k] = w.id;
        return { id: i + 2, name: "weighIn.put", args: w };
      }),
    ];
    const res = await push(member, client, mutations);
    expect(res.body.results?.map((r: { status: string }) => r.status)).toEqual(["applied", "applied", "rejected", "rejected", "applied"]);
    const mismatch = (id: string) => (db.$client.prepare("select mismatch from weigh_ins where id = ?").get(id) as { mismatch: number }).mismatch;
    expect(mismatch(ids.reordered)).toBe(0);
    expect(mismatch(ids.ulpOff)).toBe(1);
  });
});

describe("a refused change writes nothing", () => {
  it("every reason a change is refused leaves every table as it was, and the queue still advances", async () => {
    const client = uuidv7();
    const f = newFind();
    const photo = {
      id: uuidv7(),
      findId: f.id,
      sha256: "a".repeat(64),
      contentType: "image/jpeg",
      bytes: 1000,
      width: 10,
      height: 10,
      takenAt: null,
      lat: null,
      lon: null,
    };
    await push(member, client, [
      { id: 1, name: "find.put", args: f },
      { id: 2, name: "photo.put", args: photo },
    ]);
    const otherFind = newFind();
    await push(other, uuidv7(), [{ id: 1, name: "find.put", args: otherFind }]);
    const before = databaseChecksum(db).replace(/^sync_(clients|mutations):.*$/gm, "");
    const good = newWeighIn(f.id);
    const refusals = [
      { name: "find.put", args: { ...newFind(), weightGrams: -1 }, reason: "invalid" },
      { name: "find.put", args: newFind({ claimId: uuidv7() }), reason: "unknown_claim" },
      { name: "find.put", args: newFind({ outingId: uuidv7() }), reason: "unknown_parent" },
      { name: "find.put", args: { ...otherFind, notes: "mine now" }, reason: "not_owner" },
      { name: "photo.put", args: { ...photo, sha256: "b".repeat(64) }, reason: "photo_changed" },
      { name: "weighIn.put", args: newWeighIn(uuidv7()), reason: "unknown_parent" },
      { name: "weighIn.put", args: { ...good, input: { ...good.input, waterGrams: [50] } }, reason: "estimate_input" },
      { name: "weighIn.put", args: { ...good, deviceEstimate: { ...good.deviceEstimate, warnings: "none" } }, reason: "invalid" },
      { name: "outing.delete", args: { id: "not-an-id" }, reason: "invalid" },
      { name: "settings.put", args: { locationSharing: "nowhere" }, reason: "invalid" },
    ];
    const res = await push(
      member,
      client,
      refusals.map((r, i) => ({ id: 3 + i, name: r.name, args: r.args })),
    );
    expect(res.body.results.map((r) => r.reason)).toEqual(refusals.map((r) => r.reason));
    expect(res.body.lastMutationId).toBe(2 + refusals.length);
    expect(databaseChecksum(db).replace(/^sync_(clients|mutations):.*$/gm, "")).toBe(before);
    // The field named for an invalid device estimate points into it.
    expect(res.body.results[7].field).toBe("deviceEstimate.warnings");
  });
});
