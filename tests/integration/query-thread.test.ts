import Papa from "papaparse";
import { v7 as uuidv7 } from "uuid";
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { GET as getFind } from "@/app/api/club/finds/[id]/route";
import { POST as postReview } from "@/app/api/club/finds/[id]/reviews/route";
import { GET as getCsv } from "@/app/api/club/ledger/csv/route";
import { GET as getLedger } from "@/app/api/club/ledger/route";
import { LodebookDb } from "@/client/device-db";
import { applyPullPage } from "@/client/sync/apply-pull";
import type { ThreadEvent } from "@/lib/club/thread";
import type { LedgerRow } from "@/lib/club/ledger";
import { buildDigest, digestText } from "@/server/club/digest";
import type { Db } from "@/server/db";
import { startTestMail } from "../support/mail";
import { newFind, newWeighIn, pullAll, push } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, OTHER_MEMBER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

// The query thread (issue 18): an officer's query, the member's answer synced like any change,
// the find's state through it, the digest, the mail a member asked for, and the thread itself.

let db: Db;
let officer: string;
let member: string;
let other: string;
let memberId: string;
let mail: Awaited<ReturnType<typeof startTestMail>>;
const ORIGIN = "https://club.example";
const ctx = (id: string) => ({ params: Promise.resolve({ id }) });
const json = (body: unknown, cookie: string) => ({ method: "POST", cookie, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
const sql = <T>(q: string, ...args: unknown[]) => db.$client.prepare(q).get(...args) as T;
const stateOf = (id: string) => sql<{ s: string }>("select review_state s from finds where id = ?", id).s;

/** Server times are milliseconds: the next step starts in a later one, so "after" is strictly after. */
function nextMillisecond() {
  const now = Date.now();
  while (Date.now() === now);
}

async function review(findId: string, action: "verify" | "query" | "note", note = "") {
  nextMillisecond();
  const res = await postReview(req("/x", json({ action, note }, officer)), ctx(findId));
  expect(res.status).toBe(201);
  return ((await res.json()) as { id: string }).id;
}

let mutationId = 0;
const client = uuidv7();
async function send(name: string, args: unknown, cookie = member, clientId = client) {
  nextMillisecond();
  const res = await push(cookie, clientId, [{ id: cookie === member && clientId === client ? ++mutationId : 1, name, args }]);
  expect(res.status).toBe(200);
  return res.body.results[0];
}

async function ledgerRow(findId: string): Promise<LedgerRow> {
  const res = await getLedger(req(`/api/club/ledger?memberId=${memberId}&pageSize=200`, { cookie: officer }), {} as never);
  const page = (await res.json()) as { rows: LedgerRow[] };
  return page.rows.find((r) => r.id === findId)!;
}

beforeAll(async () => {
  ({ db } = await seededDatabase());
  const m = memberByEmail(db, MEMBER_EMAIL);
  memberId = m.id;
  member = await sessionCookie(m);
  officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
  other = await sessionCookie(memberByEmail(db, OTHER_MEMBER_EMAIL));
  mail = await startTestMail("query-thread");
});
afterAll(() => mail.stop());
beforeEach(async () => {
  vi.stubEnv("LODEBOOK_ORIGIN", ORIGIN);
  vi.stubEnv("AUTH_URL", "");
  await mail.clear();
});
afterEach(() => vi.unstubAllEnvs());

describe("a review reaches the member's device with its time", () => {
  it('the pull carries each review\'s server time, and the device keeps it (no more "Invalid Date")', async () => {
    const f = newFind();
    await send("find.put", f);
    const queryId = await review(f.id, "query", "Which side of the creek?");
    const { changes, cursor } = await pullAll(member, uuidv7());
    const pulled = changes.find((c) => c.entity === "review" && c.op === "put" && c.value.id === queryId);
    const createdAt = sql<{ t: number }>("select created_at t from reviews where id = ?", queryId).t;
    expect(pulled).toMatchObject({ value: { findId: f.id, action: "query", createdAt } });

    const device = new LodebookDb(`query-thread-${uuidv7()}`);
    try {
      await applyPullPage(device, changes, cursor, 0);
      const kept = await device.reviews.get(queryId);
      expect(kept?.createdAt).toBe(createdAt);
      expect(Number.isNaN(new Date(kept!.createdAt).getTime())).toBe(false);
    } finally {
      device.close();
    }
  });
});

describe("the query thread's states", () => {
  it("new → queried → answered → verified, and queried again opens it once more", async () => {
    const f = newFind();
    await send("find.put", f);
    expect(stateOf(f.id)).toBe("new");

    const first = await review(f.id, "query", "The weight looks high for a nugget that size.");
    expect(stateOf(f.id)).toBe("queried");
    expect((await ledgerRow(f.id)).changedSinceQuery).toBe(false);

    // A note asks nothing: the state stays.
    await review(f.id, "note", "Asked at the meeting too.");
    expect(stateOf(f.id)).toBe("queried");

    // The member corrects the find: still queried, and the ledger says it changed since.
    await send("find.put", { ...f, weightGrams: 4.25 });
    expect(stateOf(f.id)).toBe("queried");
    expect(await ledgerRow(f.id)).toMatchObject({ state: "queried", changedSinceQuery: true });

    // The member answers: answered, an answer is the member's own record, pulled back.
    const answer = { id: uuidv7(), findId: f.id, reviewId: first, note: "Typed 42.5 for 4.25; corrected." };
    expect((await send("answer.put", answer)).status).toBe("applied");
    expect(await ledgerRow(f.id)).toMatchObject({ state: "answered", changedSinceQuery: true });
    const filtered = (await (await getLedger(req("/api/club/ledger?state=answered&pageSize=200", { cookie: officer }), {} as never)).json()) as {
      rows: LedgerRow[];
    };
    expect(filtered.rows.map((r) => r.id)).toContain(f.id);
    const { changes } = await pullAll(member, uuidv7());
    expect(changes).toContainEqual(
      expect.objectContaining({ entity: "answer", op: "put", value: expect.objectContaining({ id: answer.id, reviewId: first, note: answer.note }) }),
    );

    // The officer verifies: verified, nothing to look at again.
    await review(f.id, "verify");
    expect(await ledgerRow(f.id)).toMatchObject({ state: "verified", changedSinceQuery: false });

    // Queried again: open until answered again; the earlier answer does not answer this one.
    const second = await review(f.id, "query", "And the depth?");
    expect(stateOf(f.id)).toBe("queried");
    expect((await ledgerRow(f.id)).changedSinceQuery).toBe(false);
    // A weigh-in after the query is a change too.
    await send("weighIn.put", newWeighIn(f.id));
    expect((await ledgerRow(f.id)).changedSinceQuery).toBe(true);
    await send("answer.put", { id: uuidv7(), findId: f.id, reviewId: second, note: "About 20 cm." });
    expect(stateOf(f.id)).toBe("answered");
  });

  it("refuses an answer to a verify or a note, to another find's query, or on another member's find", async () => {
    const f = newFind();
    const g = newFind();
    await send("find.put", f);
    await send("find.put", g);
    const query = await review(f.id, "query", "Photo, please.");
    const note = await review(f.id, "note", "Nice piece.");
    const answer = (reviewId: string, findId = f.id) => ({ id: uuidv7(), findId, reviewId, note: "Here." });
    expect(await send("answer.put", answer(note))).toMatchObject({ status: "rejected", field: "reviewId" });
    expect(await send("answer.put", answer(query, g.id))).toMatchObject({ status: "rejected", reason: "unknown_parent", field: "reviewId" });
    expect(await send("answer.put", answer(uuidv7()))).toMatchObject({ status: "rejected", reason: "unknown_parent" });
    expect(await send("answer.put", { ...answer(query), note: "  " })).toMatchObject({ status: "rejected", reason: "invalid" });
    // Another member may not answer for this member's find.
    expect(await send("answer.put", answer(query), other, uuidv7())).toMatchObject({ status: "rejected", reason: "unknown_parent", field: "findId" });
    expect(stateOf(f.id)).toBe("queried");
    expect(sql<{ n: number }>("select count(*) n from answers where find_id in (?, ?)", f.id, g.id).n).toBe(0);
  });

  it("an answer moved to another find's query leaves the first find's query open again", async () => {
    const f = newFind();
    const g = newFind();
    await send("find.put", f);
    await send("find.put", g);
    const qf = await review(f.id, "query", "First?");
    const qg = await review(g.id, "query", "Second?");
    const answer = { id: uuidv7(), findId: f.id, reviewId: qf, note: "Meant for the other one." };
    await send("answer.put", answer);
    expect([stateOf(f.id), stateOf(g.id)]).toEqual(["answered", "queried"]);
    expect((await send("answer.put", { ...answer, findId: g.id, reviewId: qg })).status).toBe("applied");
    expect([stateOf(f.id), stateOf(g.id)]).toEqual(["queried", "answered"]);
  });
});

describe("what to look at again", () => {
  it('the ledger\'s "changed since the query" filter selects exactly the queried or answered finds changed after their latest query, and the CSV says so', async () => {
    const [untouched, edited, reweighed, answeredOnly, verified] = [newFind(), newFind(), newFind(), newFind(), newFind()];
    for (const f of [untouched, edited, reweighed, answeredOnly, verified]) await send("find.put", f);
    const queries = new Map<string, string>();
    for (const f of [untouched, edited, reweighed, answeredOnly, verified]) queries.set(f.id, await review(f.id, "query", "Look again, please."));
    await send("find.put", { ...edited, notes: "Weighed at home, not at camp." });
    await send("weighIn.put", newWeighIn(reweighed.id));
    // An answer alone is not a change to the find.
    await send("answer.put", { id: uuidv7(), findId: answeredOnly.id, reviewId: queries.get(answeredOnly.id), note: "It is right as it is." });
    // Changed, then verified: nothing left to look at.
    await send("find.put", { ...verified, notes: "Corrected." });
    await review(verified.id, "verify");

    const listed = async (query: string) => {
      const res = await getLedger(req(`/api/club/ledger?${query}&pageSize=200`, { cookie: officer }), {} as never);
      expect(res.status).toBe(200);
      return (await res.json()) as { rows: LedgerRow[]; summary: { finds: number } };
    };
    const mine = [untouched, edited, reweighed, answeredOnly, verified].map((f) => f.id);
    const changed = await listed(`memberId=${memberId}&state=changed`);
    expect(
      changed.rows
        .map((r) => r.id)
        .filter((id) => mine.includes(id))
        .sort(),
    ).toEqual([edited.id, reweighed.id].sort());
    expect(changed.rows.every((r) => r.changedSinceQuery && (r.state === "queried" || r.state === "answered"))).toBe(true);
    // The totals count what the filter selects, not the whole ledger.
    expect(changed.summary.finds).toBe(changed.rows.length);

    const csv = await (await getCsv(req(`/api/club/ledger/csv?memberId=${memberId}`, { cookie: officer }), {} as never)).text();
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
    expect(parsed.meta.fields).toContain("changedSinceQuery");
    const cellOf = (id: string) => parsed.data.find((r) => r.id === id)!.changedSinceQuery;
    expect([untouched, edited, reweighed, answeredOnly, verified].map((f) => cellOf(f.id))).toEqual(["false", "true", "true", "false", "false"]);

    const refused = await getLedger(req(`/api/club/ledger?state=changed-lately`, { cookie: officer }), {} as never);
    expect(refused.status).toBe(400);
  });
});

describe("the find's thread for the officer", () => {
  it("holds the query, the member's changes, the answer and the verification, in order", async () => {
    const f = newFind({ notes: "by the old stump" });
    await send("find.put", f);
    await send("find.put", { ...f, notes: "by the old stump, north side" }); // before any review: not in the thread
    const query = await review(f.id, "query", "Which stump?");
    await send("find.put", { ...f, notes: "by the old stump, north side", weightGrams: 40.1, depthCm: 35 });
    await send("weighIn.put", newWeighIn(f.id));
    await send("answer.put", { id: uuidv7(), findId: f.id, reviewId: query, note: "The burnt one; weight re-checked." });
    await review(f.id, "verify");
    const detail = (await (await getFind(req("/x", { cookie: officer }), ctx(f.id))).json()) as { thread: ThreadEvent[]; timeZone: string };
    expect(detail.thread.map((e) => (e.kind === "review" ? e.action : e.kind))).toEqual(["query", "edit", "weighIn", "answer", "verify"]);
    expect(detail.thread[1]).toMatchObject({ kind: "edit", fields: ["weight", "depth"] });
    expect(detail.thread[3]).toMatchObject({ kind: "answer", note: "The burnt one; weight re-checked." });
    const times = detail.thread.map((e) => e.at);
    expect(times).toEqual([...times].sort((a, b) => a - b));
    expect(typeof detail.timeZone).toBe("string");
  });
});

describe("the digest", () => {
  it("lists open queries and answered ones apart, each answer with its query", async () => {
    const open = newFind({ kind: "nugget", notes: "open one" });
    const answered = newFind({ kind: "flakes" });
    await send("find.put", open);
    await send("find.put", answered);
    await review(open.id, "query", "Still waiting on this one.");
    const q = await review(answered.id, "query", "How many flakes?");
    await send("answer.put", { id: uuidv7(), findId: answered.id, reviewId: q, note: "About thirty, in one vial." });

    const d = buildDigest(Date.now() + 1000, 3650);
    expect(d.openQueries.map((x) => x.note)).toContain("Still waiting on this one.");
    expect(d.openQueries.map((x) => x.note)).not.toContain("How many flakes?");
    expect(d.answeredQueries).toContainEqual(expect.objectContaining({ kind: "flakes", note: "How many flakes?", answer: "About thirty, in one vial." }));
    expect(d.answeredQueries.map((x) => x.note)).not.toContain("Still waiting on this one.");
    const text = digestText(d);
    const openAt = text.indexOf("Queries still open:");
    const answeredAt = text.indexOf("Queries answered, to look at again:");
    expect(openAt).toBeGreaterThan(-1);
    expect(answeredAt).toBeGreaterThan(openAt);
    expect(text.indexOf("Still waiting on this one.")).toBeLessThan(answeredAt);
    expect(text.indexOf("answer: About thirty, in one vial.")).toBeGreaterThan(answeredAt);
  });
});

describe("mail when a find is queried", () => {
  it("goes to a member who asked for it (a synced setting), with a link to the find, and to no one else", async () => {
    const f = newFind();
    await send("find.put", f);
    await review(f.id, "query", "Not asked for: no mail.");
    expect(await mail.caught()).toHaveLength(0);

    expect((await send("settings.put", { mailOnQuery: true })).status).toBe("applied");
    expect(sql<{ m: number; s: string }>("select mail_on_query m, location_sharing s from members where id = ?", memberId)).toEqual({ m: 1, s: "exact" });
    // A note or a verify sends nothing; a query does, with the officer's words stripped of bidirectional controls.
    await review(f.id, "note", "Just a note.");
    await review(f.id, "query", "Check the \u202Eweight\u202C again.");
    const caught = await mail.caught();
    expect(caught).toHaveLength(1);
    expect(caught[0].to).toContain(MEMBER_EMAIL);
    expect(caught[0].subject).toMatch(/a find of yours was queried/);
    expect(caught[0].text).toContain("Check the weight again.");
    expect(caught[0].text).toContain(`${ORIGIN}/finds/view#id=${f.id}`);

    await send("settings.put", { mailOnQuery: false });
    await mail.clear();
    await review(f.id, "query", "Off again.");
    expect(await mail.caught()).toHaveLength(0);
  });
});
