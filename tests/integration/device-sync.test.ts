import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { DB_VERSION, FIRST_COPY_UNFINISHED, LodebookDb, whenNewerSchema } from "@/client/device-db";
import { deleteFind, newId, saveFind } from "@/client/logbook";
import { syncOnce } from "@/client/sync/engine";
import { DEFAULT_PULL_LIMIT } from "@/lib/sync/version";
import type { Db } from "@/server/db";
import { purgeTombstones } from "@/server/sync/tombstones";
import { fetchToSyncHandlers, newFind } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, seededDatabase, sessionCookie } from "../support/test-db";

// The device's own sync engine (Dexie on fake-indexeddb) against the real route handlers and
// a real SQLite file: each `fetch` the engine makes is answered by the handler it names.

let db: Db;
let memberId: string;
let cookie: string;
const devices: LodebookDb[] = [];

function device(name: string): LodebookDb {
  const d = new LodebookDb(`device-sync-${name}-${newId()}`);
  devices.push(d);
  return d;
}

beforeEach(async () => {
  ({ db } = await seededDatabase());
  const m = memberByEmail(db, MEMBER_EMAIL);
  memberId = m.id;
  cookie = await sessionCookie(m);
  fetchToSyncHandlers(vi.stubGlobal, () => cookie);
});

afterEach(() => {
  vi.unstubAllGlobals();
  for (const d of devices.splice(0)) d.close();
});

async function sync(d: LodebookDb) {
  const outcome = await syncOnce(d, memberId, () => {});
  expect(outcome.kind).toBe("done");
  return outcome;
}

const serverFindIds = () =>
  (db.$client.prepare("select id from finds where member_id = ? and deleted_at is null order by id").all(memberId) as { id: string }[]).map((r) => r.id);
const deviceFindIds = async (d: LodebookDb) => (await d.finds.toCollection().primaryKeys()).map(String).sort();

describe("a device away longer than deletions are kept (RELIABILITY 12)", () => {
  it("resyncs in full: what was deleted meanwhile goes, its own waiting work goes up, all three end equal", async () => {
    const phone = device("phone");
    const tablet = device("tablet");
    const demo = serverFindIds(); // the seeded club's finds of this member
    const kept = newFind();
    const doomed = newFind();
    await saveFind(phone, kept);
    await saveFind(phone, doomed);
    await sync(phone);
    await sync(tablet);
    expect(await deviceFindIds(tablet)).toEqual([...demo, kept.id, doomed.id].sort());

    // The tablet deletes one find; the phone stays away. Half a year on, the deletion is purged.
    await deleteFind(tablet, doomed.id);
    await sync(tablet);
    const later = newFind();
    const { purged, horizon } = purgeTombstones(Date.now() + 200 * 86_400_000, 180);
    expect(purged).toBeGreaterThanOrEqual(1);
    expect(db.$client.prepare("select count(*) n from finds where id = ?").get(doomed.id)).toEqual({ n: 0 });
    await saveFind(tablet, later);
    await sync(tablet);

    // Meanwhile the phone edited the kept find and logged a new one, with no signal.
    const fresh = newFind();
    await saveFind(phone, { ...kept, notes: "edited in the field" });
    await saveFind(phone, fresh);
    expect((await phone.meta.get("cursor"))?.value).toBeLessThan(horizon);
    await sync(phone);

    const expected = [...demo, kept.id, later.id, fresh.id].sort();
    expect(serverFindIds()).toEqual(expected);
    expect(await deviceFindIds(phone)).toEqual(expected);
    expect((await phone.finds.get(kept.id))?.notes).toBe("edited in the field");
    expect(await phone.outbox.count()).toBe(0);
    expect(await phone.meta.get("resync")).toBeUndefined();
    await sync(tablet);
    expect(await deviceFindIds(tablet)).toEqual(expected);
  });

  it("a device whose cursor is past the horizon pulls as usual, without a resync", async () => {
    const phone = device("phone");
    await saveFind(phone, newFind());
    await sync(phone);
    const { horizon } = purgeTombstones(Date.now() + 200 * 86_400_000, 180);
    expect((await phone.meta.get("cursor"))?.value).toBeGreaterThanOrEqual(horizon);
    const before = await phone.finds.count();
    const calls: string[] = [];
    const real = globalThis.fetch;
    vi.stubGlobal("fetch", (input: string, init?: RequestInit) => {
      calls.push(input);
      return real(input, init);
    });
    await sync(phone);
    expect(calls.filter((c) => c.includes("cursor=0&"))).toHaveLength(0);
    expect(await phone.finds.count()).toBe(before);
  });
});

describe("a new device's first copy over several pull pages", () => {
  it("is marked unfinished after its first page and whole after its last, which the screens wait for", async () => {
    const phone = device("phone");
    for (let i = 0; i <= DEFAULT_PULL_LIMIT; i++) await saveFind(phone, newFind());
    await sync(phone);
    // A new phone: each page's end is seen through the meta table's writes.
    const tablet = device("tablet");
    const marks: string[] = [];
    tablet.meta.hook("creating", (key) => void marks.push(`set ${String(key)}`));
    tablet.meta.hook("deleting", (key) => void marks.push(`cleared ${String(key)}`));
    await sync(tablet);
    expect(marks.filter((m) => m.endsWith(FIRST_COPY_UNFINISHED))).toEqual([`set ${FIRST_COPY_UNFINISHED}`, `cleared ${FIRST_COPY_UNFINISHED}`]);
    expect(await tablet.meta.get(FIRST_COPY_UNFINISHED)).toBeUndefined();
    expect(await deviceFindIds(tablet)).toEqual(serverFindIds());
    // Its next sync (one page) marks nothing.
    marks.length = 0;
    await sync(tablet);
    expect(marks.filter((m) => m.endsWith(FIRST_COPY_UNFINISHED))).toEqual([]);
  }, 60_000);
});

/** The next app version as it will look: one more schema version with an upgrade step. */
class NextVersionDb extends LodebookDb {
  constructor(name: string) {
    super(name);
    this.version(DB_VERSION + 1)
      .stores({ finds: "id, foundAt, outingId, kind, claimId, weightGrams" })
      .upgrade(async (tx) => {
        await tx.table("meta").put({ key: "upgradedFrom", value: DB_VERSION });
      });
  }
}

describe("an app update that bumps the device schema (RELIABILITY 19)", () => {
  it("migrates with a full outbox while an old tab is open; the old tab steps aside to reload; the outbox goes up once", async () => {
    const name = `device-sync-upgrade-${newId()}`;
    const oldTab = new LodebookDb(name);
    devices.push(oldTab);
    const reloads: string[] = [];
    whenNewerSchema(() => reloads.push("reload"));
    const finds = [newFind(), newFind(), newFind()];
    for (const f of finds) await saveFind(oldTab, f);
    expect(await oldTab.outbox.count()).toBe(3);

    const newTab = new NextVersionDb(name);
    devices.push(newTab);
    await newTab.open();
    expect(newTab.verno).toBe(DB_VERSION + 1);
    expect(reloads).toEqual(["reload"]);
    expect(oldTab.isOpen()).toBe(false);
    expect((await newTab.meta.get("upgradedFrom"))?.value).toBe(DB_VERSION);
    expect(await newTab.finds.where("weightGrams").above(0).count()).toBe(3);
    expect(await newTab.outbox.count()).toBe(3);

    await sync(newTab);
    expect(await newTab.outbox.count()).toBe(0);
    for (const f of finds) expect(db.$client.prepare("select count(*) n from finds where id = ?").get(f.id)).toEqual({ n: 1 });

    // The old tab, reloaded with the old code, still opens the upgraded database (Dexie adapts
    // to the installed version) and sees the same records.
    const reloaded = new LodebookDb(name);
    devices.push(reloaded);
    expect(await reloaded.finds.count()).toBe(await newTab.finds.count());
  });
});

describe("answers that stop a sync without losing anything (RELIABILITY 20, 22)", () => {
  it("20: a server that refuses this copy as outdated keeps the outbox and asks the member to update", async () => {
    const phone = device("phone");
    await saveFind(phone, newFind());
    const real = globalThis.fetch;
    // This copy speaks a protocol the server no longer takes.
    vi.stubGlobal("fetch", (input: string, init?: RequestInit) => {
      if (typeof init?.body === "string") init = { ...init, body: init.body.replace(/"protocolVersion":\d+/, '"protocolVersion":0') };
      return real(input.replace(/protocolVersion=\d+/, "protocolVersion=0"), init);
    });
    const outcome = await syncOnce(phone, memberId, () => {});
    expect(outcome).toMatchObject({ kind: "outdated", waiting: 1 });
    expect(await phone.outbox.count()).toBe(1);
    vi.stubGlobal("fetch", real);
    await sync(phone);
    expect(await phone.outbox.count()).toBe(0);
  });

  it("22: an expired session keeps the outbox and asks to sign in; signed in again, it goes up once", async () => {
    const phone = device("phone");
    const f = newFind();
    await saveFind(phone, f);
    const signedIn = cookie;
    cookie = "";
    const outcome = await syncOnce(phone, memberId, () => {});
    expect(outcome).toMatchObject({ kind: "needs-sign-in", reason: "expired", waiting: 1 });
    expect(db.$client.prepare("select count(*) n from finds where id = ?").get(f.id)).toEqual({ n: 0 });
    cookie = signedIn;
    await sync(phone);
    expect(await phone.outbox.count()).toBe(0);
    expect(db.$client.prepare("select count(*) n from finds where id = ?").get(f.id)).toEqual({ n: 1 });
  });
});
