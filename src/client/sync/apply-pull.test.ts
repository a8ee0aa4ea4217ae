import { afterEach, describe, expect, it } from "vitest";
import { FIRST_COPY_UNFINISHED, LodebookDb } from "../device-db";
import { newId } from "../logbook";
import { applyPullPage } from "./apply-pull";
import type { PullChange } from "@/lib/sync/protocol";

// One pull page written with a bulk call per table must leave the device as applying its
// changes one by one, in order, would.

const opened: LodebookDb[] = [];
afterEach(async () => {
  for (const d of opened.splice(0)) await d.delete();
});
function device() {
  const d = new LodebookDb(`apply-pull-${newId()}`);
  opened.push(d);
  return d;
}

const find = (id: string, notes: string) => ({
  id,
  outingId: null,
  claimId: null,
  kind: "nugget",
  weightGrams: 1.5,
  purity: null,
  depthCm: null,
  method: "detecting",
  notes,
  lat: null,
  lon: null,
  accuracyM: null,
  locationSource: null,
  foundAt: 1_780_000_000_000,
  updatedAt: 1_780_000_000_500,
  latestFineGrams: 1.2,
  fineBasis: "fineness",
});
let seq = 0;
const put = (entity: PullChange["entity"], value: Record<string, unknown>): PullChange => ({ seq: ++seq, entity, op: "put", value });
const del = (entity: PullChange["entity"], id: string): PullChange => ({ seq: ++seq, entity, op: "del", id });

describe("a pull page", () => {
  it("ends with the last change of each record, as applying them in order would", async () => {
    const db = device();
    const [a, b, c] = [newId(), newId(), newId()];
    await applyPullPage(
      db,
      [put("find", find(a, "first")), put("find", find(b, "kept")), put("find", find(a, "second")), put("find", find(c, "gone")), del("find", c)],
      5,
      0,
    );
    expect((await db.finds.get(a))?.notes).toBe("second");
    expect((await db.finds.get(b))?.figure).toMatchObject({ fineGrams: 1.2, basis: "fineness" });
    expect(await db.finds.get(c)).toBeUndefined();
    await applyPullPage(db, [del("find", b), put("find", find(b, "back"))], 7, 0);
    expect((await db.finds.get(b))?.notes).toBe("back");
    expect((await db.meta.get("cursor"))?.value).toBe(7);
  });

  it("leaves a record with a change waiting on this device as the device has it", async () => {
    const db = device();
    const a = newId();
    await applyPullPage(db, [put("find", find(a, "server"))], 1, 0);
    await db.finds.update(a, { notes: "typed here" });
    await db.outbox.add({ name: "find.put", args: {}, entityId: a, createdAt: Date.now(), state: "pending" });
    await applyPullPage(db, [put("find", find(a, "server again"))], 2, 0);
    expect((await db.finds.get(a))?.notes).toBe("typed here");
    await applyPullPage(db, [del("find", a)], 3, 0);
    expect(await db.finds.get(a)).toBeDefined();
  });

  it("keeps a photo's bytes on this device when its record comes back", async () => {
    const db = device();
    const id = newId();
    const findId = newId();
    const photo = { id, findId, takenAt: 1, width: 10, height: 10, bytes: 3, sha256: "0".repeat(64), stored: false, updatedAt: 2 };
    await db.photos.put({ ...photo, blob: new Blob(["abc"]), thumb: new Blob(["a"]), uploaded: 0 } as never);
    await applyPullPage(db, [put("photo", photo)], 1, 0);
    const local = await db.photos.get(id);
    expect(local?.blob.size).toBe(3);
    expect(local?.uploaded).toBe(0);
    await applyPullPage(db, [put("photo", { ...photo, stored: true })], 2, 0);
    expect((await db.photos.get(id))?.uploaded).toBe(1);
  });
});

describe("a device's first copy over several pages", () => {
  const unfinished = async (db: LodebookDb) => (await db.meta.get(FIRST_COPY_UNFINISHED)) !== undefined;

  it("is marked unfinished from its first page to its last, in the pages' own transactions", async () => {
    const db = device();
    await applyPullPage(db, [put("find", find(newId(), "page one"))], 500, 0, true);
    expect(await unfinished(db)).toBe(true);
    await applyPullPage(db, [put("find", find(newId(), "page two"))], 1000, 0, true);
    expect(await unfinished(db)).toBe(true);
    await applyPullPage(db, [put("find", find(newId(), "last page"))], 1200, 0, false);
    expect(await unfinished(db)).toBe(false);
    expect(await db.finds.count()).toBe(3);
    expect((await db.meta.get("cursor"))?.value).toBe(1200);
  });

  it("is never marked on a device that already holds a cursor: a device in the field, a resync from 0", async () => {
    const fielded = device();
    await fielded.meta.put({ key: "cursor", value: 40 });
    await applyPullPage(fielded, [put("find", find(newId(), "many new"))], 540, 0, true);
    expect(await unfinished(fielded)).toBe(false);
    const resyncing = device();
    await resyncing.meta.put({ key: "cursor", value: 0 });
    await applyPullPage(resyncing, [put("find", find(newId(), "again"))], 500, 0, true);
    expect(await unfinished(resyncing)).toBe(false);
  });

  it("a one-page first copy is never marked", async () => {
    const db = device();
    await applyPullPage(db, [put("find", find(newId(), "all of it"))], 12, 0, false);
    expect(await unfinished(db)).toBe(false);
  });
});
