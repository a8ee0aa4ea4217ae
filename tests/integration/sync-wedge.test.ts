import fc from "fast-check";
import { v7 as uuidv7 } from "uuid";
import { beforeEach, describe, expect, it } from "vitest";
import type { Db } from "@/server/db";
import { resetLimits } from "@/server/limits";
import { databaseChecksum, MEMBER_EMAIL, memberByEmail, OTHER_MEMBER_EMAIL, seededDatabase, sessionCookie } from "../support/test-db";
import { applyChanges, newFind, newOuting, newWeighIn, pullAll, push, type Mutation } from "../support/sync-client";

// RELIABILITY 38, 39: no well-formed batch wedges the queue with a 5xx, and a mutation id used
// twice with different content (two devices sharing a client id) is never silently skipped.

let db: Db;
let member: string;
let memberId: string;
let otherId: string;

beforeEach(async () => {
  ({ db } = await seededDatabase());
  const m = memberByEmail(db, MEMBER_EMAIL);
  memberId = m.id;
  member = await sessionCookie(m);
  otherId = memberByEmail(db, OTHER_MEMBER_EMAIL).id;
});

const ids = (sql: string, ...args: unknown[]) => (db.$client.prepare(sql).all(...args) as { id: string }[]).map((r) => r.id);

const newPhoto = (findId: string) => ({
  id: uuidv7(),
  findId,
  sha256: "a".repeat(64),
  contentType: "image/jpeg",
  bytes: 1000,
  width: 100,
  height: 80,
  takenAt: null,
  lat: null,
  lon: null,
});

describe("a reference to a record of the wrong kind (RELIABILITY 39)", () => {
  it("is refused with a reason, also when that record was written earlier in the same push", async () => {
    const o = newOuting();
    const f = newFind();
    const res = await push(member, uuidv7(), [
      { id: 1, name: "outing.put", args: o },
      { id: 2, name: "find.put", args: f },
      { id: 3, name: "weighIn.put", args: newWeighIn(o.id) }, // "find" is an outing
      { id: 4, name: "photo.put", args: newPhoto(o.id) },
      { id: 5, name: "find.put", args: newFind({ outingId: f.id }) }, // "outing" is a find
      { id: 6, name: "weighIn.put", args: newWeighIn(f.id) },
    ]);
    expect(res.status).toBe(200);
    expect(res.body.results.map((r) => r.reason ?? r.status)).toEqual(["applied", "applied", "unknown_parent", "unknown_parent", "unknown_parent", "applied"]);
    expect(res.body.results[2].field).toBe("findId");
    expect(res.body.results[4].field).toBe("outingId");
    expect(res.body.lastMutationId).toBe(6);
  });

  it("is refused when the record of the other kind is already on the server", async () => {
    const o = newOuting();
    const client = uuidv7();
    await push(member, client, [{ id: 1, name: "outing.put", args: o }]);
    const res = await push(member, client, [{ id: 2, name: "weighIn.put", args: newWeighIn(o.id) }]);
    expect(res.body.results[0]).toMatchObject({ status: "rejected", reason: "unknown_parent" });
  });
});

describe("a mutation id used again with other content (RELIABILITY 38)", () => {
  it("is answered as a reuse, naming the replays; nothing of that push is applied", async () => {
    const client = uuidv7();
    const a1 = newFind();
    const a2 = newFind();
    expect(
      (
        await push(member, client, [
          { id: 1, name: "find.put", args: a1 },
          { id: 2, name: "find.put", args: a2 },
        ])
      ).status,
    ).toBe(200);
    const before = databaseChecksum(db);

    // A copied profile: the same client id, its own change under id 2, and a fresh one after.
    const b2 = newFind();
    const b3 = newFind();
    const res = await push(member, client, [
      { id: 1, name: "find.put", args: a1 },
      { id: 2, name: "find.put", args: b2 },
      { id: 3, name: "find.put", args: b3 },
    ]);
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: "conflict:client_reused", fields: { reused: ["2"], replayed: ["1"] } });
    expect(databaseChecksum(db)).toBe(before);

    // A true replay is still skipped.
    const replay = await push(member, client, [{ id: 2, name: "find.put", args: a2 }]);
    expect(replay.body.results).toEqual([{ id: 2, status: "skipped" }]);
  });

  it("keeps digests only for the recent window of each client", async () => {
    const client = uuidv7();
    let id = 0;
    for (let round = 0; round < 5; round++) {
      const batch = Array.from({ length: 500 }, () => ({ id: ++id, name: "find.delete", args: { id: uuidv7() } }));
      expect((await push(member, client, batch)).status).toBe(200);
    }
    const kept = db.$client.prepare("select count(*) n, min(mutation_id) lo from sync_mutations where client_id = ?").get(client) as { n: number; lo: number };
    expect(kept).toEqual({ n: 2000, lo: 501 });
  });
});

describe("random batches with references shuffled across kinds and members (RELIABILITY 39)", () => {
  it("never answer 5xx, and a full pull holds what the server holds", async () => {
    const others = {
      finds: ids("select id from finds where member_id = ? limit 3", otherId),
      outings: ids("select id from outings where member_id = ? limit 3", otherId),
    };
    const claims = ids("select id from claims limit 2");
    // Officers' reviews an answer can name: queries and a verify, of this member's finds and another's.
    const reviews = ids("select id from reviews where action = 'query' limit 4").concat(ids("select id from reviews where action = 'verify' limit 1"));
    await fc.assert(
      fc.asyncProperty(
        fc.array(
          fc.record({
            kind: fc.constantFrom(
              "outing.put",
              "find.put",
              "weighIn.put",
              "photo.put",
              "answer.put",
              "outing.delete",
              "find.delete",
              "weighIn.delete",
              "photo.delete",
            ),
            pick: fc.nat(),
            claim: fc.nat(),
          }),
          { minLength: 1, maxLength: 14 },
        ),
        fc.boolean(),
        async (steps, split) => {
          // Ids the batch makes, plus another member's records and the club's claims: any of them
          // can be named where a find, an outing or a claim is expected.
          const made: string[] = [];
          // Mostly the batch's own ids (of any kind), sometimes another member's or a claim's.
          const elsewhere = [...others.finds, ...others.outings, ...claims];
          const ref = (n: number) => (made.length > 0 && n % 4 !== 3 ? made[(n >> 2) % made.length] : elsewhere[n % elsewhere.length]);
          const mutations: Mutation[] = steps.map((s, i) => {
            const id = i + 1;
            const claimId = s.claim % 3 === 0 ? null : ref(s.claim);
            switch (s.kind) {
              case "outing.put": {
                const o = newOuting({ claimId, ...(s.pick % 4 === 0 && made.length ? { id: ref(s.pick) } : {}) });
                made.push(o.id);
                return { id, name: s.kind, args: o };
              }
              case "find.put": {
                const f = newFind({ claimId, outingId: s.pick % 2 ? ref(s.pick) : null, ...(s.pick % 5 === 0 && made.length ? { id: ref(s.pick + 1) } : {}) });
                made.push(f.id);
                return { id, name: s.kind, args: f };
              }
              case "weighIn.put": {
                const w = { ...newWeighIn(ref(s.pick)), ...(s.pick % 3 === 0 && made.length ? { id: ref(s.claim) } : {}) };
                made.push(w.id);
                return { id, name: s.kind, args: w };
              }
              case "photo.put": {
                const p = newPhoto(ref(s.pick));
                made.push(p.id);
                return { id, name: s.kind, args: p };
              }
              case "answer.put": {
                const a = {
                  id: s.pick % 3 === 0 && made.length ? ref(s.claim) : uuidv7(),
                  findId: ref(s.pick),
                  reviewId: s.claim % 2 ? reviews[s.claim % reviews.length] : ref(s.claim),
                  note: "Here.",
                };
                made.push(a.id);
                return { id, name: s.kind, args: a };
              }
              default:
                return { id, name: s.kind, args: { id: ref(s.pick) } };
            }
          });
          resetLimits(); // a member's push limit is not what this property is about
          const client = uuidv7();
          const batches = split ? [mutations.slice(0, mutations.length >> 1), mutations.slice(mutations.length >> 1)].filter((b) => b.length) : [mutations];
          for (const batch of batches) {
            const res = await push(member, client, batch);
            expect(res.status, JSON.stringify(res.body)).toBe(200);
            // The same batch again is a replay: skipped, never a 5xx or a reuse.
            const again = await push(member, client, batch);
            expect(again.status).toBe(200);
            expect(again.body.results.every((r) => r.status === "skipped")).toBe(true);
          }
          expect((await pullAll(member, client)).lastMutationId).toBe(mutations.length);
          expectPullHoldsServer(applyChanges((await pullAll(member, client)).changes));
        },
      ),
      { numRuns: 80 },
    );
  }, 120_000);
});

/** A device that pulls everything holds exactly the member's live records, of every kind. */
function expectPullHoldsServer(device: ReturnType<typeof applyChanges>) {
  const tables = { outing: "outings", find: "finds", weighIn: "weigh_ins", photo: "photos", answer: "answers" } as const;
  for (const [entity, table] of Object.entries(tables)) {
    const server = ids(`select id from ${table} where member_id = ? and deleted_at is null order by id`, memberId);
    expect([...(device.get(entity)?.keys() ?? [])].sort(), entity).toEqual(server);
  }
}
