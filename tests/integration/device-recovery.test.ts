import os from "node:os";
import path from "node:path";
import fs from "node:fs";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { LodebookDb } from "@/client/device-db";
import { deleteFind, newId, saveFind } from "@/client/logbook";
import { FAULTS_BEFORE_SET_ASIDE, syncOnce } from "@/client/sync/engine";
import { retryStuck } from "@/client/sync/recover";
import type { Find } from "@/lib/entities/find";
import { backupTo, restoreFrom } from "@/server/backup";
import { closeDb, getDb, type Db } from "@/server/db";
import { resetLimits } from "@/server/limits";
import { logger } from "@/server/log";
import { purgeTombstones } from "@/server/sync/tombstones";
import { fetchToSyncHandlers, newFind } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, seededDatabase, sessionCookie } from "../support/test-db";

// RELIABILITY 16, 38, 39 on the device: its own sync engine (Dexie on fake-indexeddb) against
// the real route handlers and a real SQLite file. Every recovery path meets a create, an edit
// and a delete waiting, and every test ends with the device holding what the server holds.

let db: Db;
let file: string;
let memberId: string;
let cookie: string;
const devices: LodebookDb[] = [];

function device(name: string): LodebookDb {
  const d = new LodebookDb(`device-recovery-${name}-${newId()}`);
  devices.push(d);
  return d;
}

beforeEach(async () => {
  ({ db, file } = await seededDatabase());
  resetLimits();
  const m = memberByEmail(db, MEMBER_EMAIL);
  memberId = m.id;
  cookie = await sessionCookie(m);
  fetchToSyncHandlers(vi.stubGlobal, () => cookie);
});

afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
  for (const d of devices.splice(0)) d.close();
});

async function sync(d: LodebookDb, report: Parameters<typeof syncOnce>[2] = () => {}) {
  const outcome = await syncOnce(d, memberId, report);
  expect(outcome.kind, JSON.stringify(outcome)).toBe("done");
  return outcome;
}

/** The member's live finds as `id notes`, on the server and on a device. */
const serverFinds = () =>
  (
    db.$client.prepare("select id, notes from finds where member_id = ? and deleted_at is null order by id").all(memberId) as { id: string; notes: string }[]
  ).map((r) => `${r.id} ${r.notes}`);
const deviceFinds = async (d: LodebookDb) => (await d.finds.orderBy("id").toArray()).map((f) => `${f.id} ${f.notes}`);

async function expectDeviceEqualsServer(d: LodebookDb) {
  expect(await deviceFinds(d)).toEqual(serverFinds());
  expect(await d.outbox.where("state").equals("pending").count()).toBe(0);
}

/** A restore from a backup taken now: returns the function that puts it back in place. */
async function takeBackup() {
  const backup = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-restore-")), "copy.db");
  await backupTo(backup);
  return () => {
    closeDb();
    restoreFrom(backup, file);
    db = getDb();
  };
}

/**
 * Runs `work` when the device's next pull request arrives, before the handler answers it: the
 * engine waits for that answer, so the work is done at a known step (no timer, no race).
 */
function beforeFirstPull<T>(work: () => Promise<T>): () => Promise<T> {
  const real = globalThis.fetch;
  let done: Promise<T> | undefined;
  vi.stubGlobal("fetch", async (input: string, init?: RequestInit) => {
    if (!done && input.startsWith("/api/sync/pull")) await (done = work());
    return real(input, init);
  });
  return () => done ?? Promise.reject(new Error("no pull came"));
}

/** A create, an edit and a delete, waiting on the device. */
async function waitingWork(d: LodebookDb, edit: Find, doomed: Find) {
  const created = newFind({ notes: "made while away" });
  await saveFind(d, created);
  await saveFind(d, { ...edit, notes: "edited while away" });
  await deleteFind(d, doomed.id);
  return created;
}

describe("recovery paths keep every waiting change, deletions included (RELIABILITY 16, 38)", () => {
  it("gap: the server restored from a backup expects an id this device already used; all goes again, the delete too", async () => {
    const phone = device("phone");
    const edit = newFind();
    const doomed = newFind();
    await saveFind(phone, edit);
    await saveFind(phone, doomed);
    await sync(phone);
    const restore = await takeBackup();
    const lost = newFind({ notes: "acknowledged, then lost in the restore" });
    await saveFind(phone, lost);
    await sync(phone);
    restore();
    expect(serverFinds().some((f) => f.startsWith(lost.id))).toBe(false);

    const created = await waitingWork(phone, edit, doomed);
    await sync(phone);
    const live = serverFinds();
    expect(live).toContain(`${edit.id} edited while away`);
    expect(live).toContain(`${created.id} made while away`);
    expect(live.some((f) => f.startsWith(lost.id))).toBe(true);
    expect(live.some((f) => f.startsWith(doomed.id))).toBe(false);
    await expectDeviceEqualsServer(phone);
  });

  it("reset: the pull finds the server behind this device while changes wait; they go up, the delete too", async () => {
    const phone = device("phone");
    const edit = newFind();
    const doomed = newFind();
    await saveFind(phone, edit);
    await saveFind(phone, doomed);
    await sync(phone);
    const restore = await takeBackup();
    await saveFind(phone, newFind());
    await sync(phone);
    restore();

    // The changes are made while the sync waits for its pull (after it sent): the pull answers reset.
    const made = beforeFirstPull(() => waitingWork(phone, edit, doomed));
    await sync(phone);
    const created = await made();
    const live = serverFinds();
    expect(live).toContain(`${edit.id} edited while away`);
    expect(live).toContain(`${created.id} made while away`);
    expect(live.some((f) => f.startsWith(doomed.id))).toBe(false);
    await expectDeviceEqualsServer(phone);
  });

  it("full resync after the deletion horizon: waiting changes go up, purged deletions stay deleted", async () => {
    const phone = device("phone");
    const tablet = device("tablet");
    const edit = newFind();
    const doomed = newFind();
    const goneElsewhere = newFind();
    for (const f of [edit, doomed, goneElsewhere]) await saveFind(phone, f);
    await sync(phone);
    await sync(tablet);
    await deleteFind(tablet, goneElsewhere.id);
    await sync(tablet);
    const { horizon } = purgeTombstones(Date.now() + 200 * 86_400_000, 180);
    expect((await phone.meta.get("cursor"))?.value).toBeLessThan(horizon);

    const work = beforeFirstPull(() => waitingWork(phone, edit, doomed));
    await sync(phone);
    const made = await work();
    await sync(phone);
    const live = serverFinds();
    expect(live).toContain(`${edit.id} edited while away`);
    expect(live).toContain(`${made.id} made while away`);
    expect(live.some((f) => f.startsWith(doomed.id) || f.startsWith(goneElsewhere.id))).toBe(false);
    await expectDeviceEqualsServer(phone);
    await sync(tablet);
    await expectDeviceEqualsServer(tablet);
  });
});

/** A copied browser profile: every table and the sync state, client id included. */
async function copyDevice(from: LodebookDb, to: LodebookDb) {
  for (const table of from.tables) await to.table(table.name).bulkPut(await table.toArray());
}

describe("two devices sharing one client id (RELIABILITY 38)", () => {
  it("a change under a used mutation id is never skipped: the device takes a new client id and sends again", async () => {
    const phone = device("phone");
    const first = newFind();
    await saveFind(phone, first);
    await sync(phone);
    const waiting = newFind({ notes: "waiting when the profile was copied" });
    await saveFind(phone, waiting);
    const copy = device("copy");
    await copyDevice(phone, copy);
    expect((await copy.meta.get("clientId"))?.value).toBe((await phone.meta.get("clientId"))?.value);

    await sync(phone); // sends the waiting find under id 2
    const onCopy = newFind({ notes: "made on the copy" });
    await saveFind(copy, onCopy);
    await sync(copy); // id 2 again with the same content (a replay), and the copy's own find under id 3
    const onPhone = newFind({ notes: "made on the phone" });
    await saveFind(phone, onPhone);
    await sync(phone); // id 3 again, other content: a reuse, so the phone takes a new client id
    expect((await phone.meta.get("clientId"))?.value).not.toBe((await copy.meta.get("clientId"))?.value);

    const live = serverFinds();
    for (const f of [first, waiting, onCopy, onPhone]) expect(live).toContain(`${f.id} ${f.notes}`);
    expect(db.$client.prepare("select count(*) n from finds where id = ?").get(waiting.id)).toEqual({ n: 1 });
    await sync(copy);
    await expectDeviceEqualsServer(phone);
    await expectDeviceEqualsServer(copy);
  });
});

describe("a change the server fails on every time (RELIABILITY 39)", () => {
  it("backs off, then sets that one change aside with the server's error id, and the rest goes up", async () => {
    // A server fault no refusal covers: a trigger that aborts on one find's notes.
    db.$client.exec("create trigger poison before insert on finds when new.notes = 'poison' begin select raise(abort, 'poisoned'); end");
    const logged: string[] = [];
    vi.spyOn(logger, "error").mockImplementation(((obj: { errorId?: string }) => void logged.push(obj.errorId ?? "")) as never);
    const phone = device("phone");
    const before = newFind();
    const bad = newFind({ notes: "poison" });
    const after = newFind();
    for (const f of [before, bad, after]) await saveFind(phone, f);

    for (let i = 1; i < FAULTS_BEFORE_SET_ASIDE; i++) {
      const outcome = await syncOnce(phone, memberId, () => {});
      expect(outcome).toMatchObject({ kind: "error", waiting: 3 });
    }
    await sync(phone);
    const stuck = await phone.outbox.where("state").equals("stuck").toArray();
    expect(stuck.map((e) => e.entityId)).toEqual([bad.id]);
    expect(logged).toContain(stuck[0].errorId);
    const live = serverFinds();
    expect(live.some((f) => f.startsWith(before.id))).toBe(true);
    expect(live.some((f) => f.startsWith(after.id))).toBe(true);

    // The club fixes the server; "Try again" sends it.
    db.$client.exec("drop trigger poison");
    await retryStuck(phone);
    await sync(phone);
    expect(await phone.outbox.count()).toBe(0);
    await expectDeviceEqualsServer(phone);
  });

  it("a server failing on everything is not taken for one bad change: the set-aside is undone", async () => {
    db.$client.exec("create trigger down before insert on finds begin select raise(abort, 'down'); end");
    vi.spyOn(logger, "error").mockImplementation((() => undefined) as never);
    const phone = device("phone");
    for (let i = 0; i < 3; i++) await saveFind(phone, newFind());
    for (let i = 0; i < FAULTS_BEFORE_SET_ASIDE + 1; i++) expect((await syncOnce(phone, memberId, () => {})).kind).toBe("error");
    expect(await phone.outbox.where("state").equals("stuck").count()).toBe(0);
    db.$client.exec("drop trigger down");
    await sync(phone);
    await expectDeviceEqualsServer(phone);
  });
});
