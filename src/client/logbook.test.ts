import Dexie from "dexie";
import { afterEach, describe, expect, it, vi } from "vitest";
import { makeJpeg } from "../../tests/support/jpeg";
import { closeMemberDbs, databaseNameFor, DB_VERSION, LodebookDb, memberDb } from "./device-db";
import { addSetupCheck, LocalValidationError, newId, saveAnswer, saveFind, saveScale, startOuting } from "./logbook";
import { judgeSetupCheck } from "@/lib/estimate/setup-check";
import { readPhotoMeta } from "./photos";
import { FINENESS_PRESETS, HOST_PRESETS } from "@/lib/estimate/presets";
import { DEFAULT_SETTINGS, readSettings, saveSettings } from "./settings";

const find = (over: Partial<Parameters<typeof saveFind>[1]> = {}) => ({
  id: newId(),
  outingId: null,
  claimId: null,
  kind: "nugget" as const,
  weightGrams: 1.23,
  purity: null,
  depthCm: null,
  method: "detecting" as const,
  notes: "",
  lat: 41.8,
  lon: -117.62,
  accuracyM: 5,
  locationSource: "device" as const,
  foundAt: Date.UTC(2026, 5, 1),
  ...over,
});

let counter = 0;
const freshDb = () => memberDb(`m-${Date.now()}-${counter++}`);

afterEach(() => {
  closeMemberDbs();
  vi.restoreAllMocks();
});

describe("device database", () => {
  it("writes a record and its outbox entry together", async () => {
    const db = freshDb();
    const f = await saveFind(db, find());
    expect(await db.finds.get(f.id)).toMatchObject({ weightGrams: 1.23 });
    const outbox = await db.outbox.toArray();
    expect(outbox).toHaveLength(1);
    expect(outbox[0]).toMatchObject({ name: "find.put", entityId: f.id, state: "pending" });
  });

  it("leaves neither the record nor the outbox entry when the outbox write fails", async () => {
    const db = freshDb();
    vi.spyOn(db.outbox, "add").mockImplementation(() => Promise.reject(new Error("disk trouble")) as never);
    const f = find();
    await expect(saveFind(db, f)).rejects.toThrow("disk trouble");
    expect(await db.finds.get(f.id)).toBeUndefined();
    expect(await db.outbox.count()).toBe(0);
  });

  it("refuses an invalid record on the device, naming the field, and writes nothing", async () => {
    const db = freshDb();
    const err = await saveFind(db, find({ weightGrams: -2 })).catch((e) => e);
    expect(err).toBeInstanceOf(LocalValidationError);
    expect(Object.keys((err as LocalValidationError).fields)).toContain("weightGrams");
    expect(await db.finds.count()).toBe(0);
    expect(await db.outbox.count()).toBe(0);
  });

  it("gives every queued change a larger mutation id than the one before", async () => {
    const db = freshDb();
    await startOuting(db, { claimId: null, method: "panning" });
    await saveFind(db, find());
    await saveFind(db, find());
    const ids = (await db.outbox.toArray()).map((e) => e.id!);
    expect(ids).toEqual([...ids].sort((a, b) => a - b));
    expect(new Set(ids).size).toBe(3);
  });

  it("keeps each member's records in a database of their own", async () => {
    const a = memberDb("member-a");
    const b = memberDb("member-b");
    await saveFind(a, find());
    expect(await a.finds.count()).toBe(1);
    expect(await b.finds.count()).toBe(0);
    expect(a.name).toBe(databaseNameFor("member-a"));
    expect(a.name).not.toBe(b.name);
  });

  it("upgrades a version 1 database to the current version and keeps its data", async () => {
    const name = databaseNameFor(`upgrade-${Date.now()}`);
    const v1 = new Dexie(name);
    v1.version(1).stores({
      outings: "id, startedAt",
      finds: "id, foundAt, outingId, kind",
      photos: "id, findId",
      weighIns: "id, findId",
      claims: "id",
      settings: "key",
      outbox: "++id",
    });
    const f = find();
    await v1.table("finds").add({ ...f, updatedAt: 1 });
    await v1.table("photos").add({ id: "p1", findId: f.id });
    await v1.table("outbox").add({ name: "find.put", args: f, entityId: f.id, createdAt: 1 });
    await v1.table("weighIns").add({ id: "w1", findId: f.id });
    v1.close();

    const v2 = new LodebookDb(name);
    await v2.open();
    expect(v2.verno).toBe(DB_VERSION);
    // Weigh-ins from before scale profiles name no scale.
    expect(await v2.weighIns.get("w1")).toMatchObject({ scaleId: null, scaleCheck: null });
    expect(await v2.scales.count()).toBe(0);
    expect(await v2.finds.get(f.id)).toMatchObject({ weightGrams: 1.23 });
    expect(await v2.photos.where("uploaded").equals(0).count()).toBe(1);
    expect(await v2.outbox.where("state").equals("pending").count()).toBe(1);
    v2.close();
  });

  it("keeps a scale's setup checks with it, each saved with the scale for camp sync", async () => {
    const db = freshDb();
    const scale = await saveScale(db, { id: newId(), name: "Pocket", stepGrams: 0.01, accuracyGrams: null, checks: [] });
    const input = { method: "hanging" as const, airGrams: [50], waterGrams: [44.42] };
    const reference = { kind: "copper" as const, label: "Copper", density: 8.96, uncertainty: 0.02 };
    await addSetupCheck(db, scale.id, { id: newId(), checkedAt: Date.UTC(2026, 6, 1), reference, input, result: judgeSetupCheck(input, reference) });
    expect((await db.scales.get(scale.id))!.checks).toHaveLength(1);
    const queued = await db.outbox.toArray();
    expect(queued.map((e) => e.name)).toEqual(["scale.put", "scale.put"]);
    expect((queued[1].args as { checks: unknown[] }).checks).toHaveLength(1);
  });

  it("keeps settings on the device and queues only the location sharing for the server", async () => {
    const db = freshDb();
    await saveSettings(db, { massUnit: "dwt" });
    expect(await db.outbox.count()).toBe(0);
    await saveSettings(db, { locationSharing: "claim" });
    expect((await readSettings(db)).massUnit).toBe("dwt");
    expect(await db.outbox.toArray()).toMatchObject([{ name: "settings.put", args: { locationSharing: "claim" } }]);
  });
});

describe("default settings", () => {
  it("name the first host and fineness presets of the weigh-in flow", () => {
    expect(DEFAULT_SETTINGS.hostPreset).toBe(HOST_PRESETS[0].id);
    expect(DEFAULT_SETTINGS.finenessPreset).toBe(FINENESS_PRESETS[0].id);
  });
});

describe("photo EXIF", () => {
  it("reads GPS position and capture time from a JPEG made here", async () => {
    const takenAt = new Date(2026, 6, 14, 9, 30, 15);
    const bytes = makeJpeg({ width: 64, height: 48, lat: 41.80123, lon: -117.61987, takenAt });
    const meta = await readPhotoMeta(new Blob([new Uint8Array(bytes)]));
    expect(meta.lat).toBeCloseTo(41.80123, 5);
    expect(meta.lon).toBeCloseTo(-117.61987, 5);
    expect(meta.takenAt).toBe(takenAt.getTime());
  });

  it("reports no position for a JPEG without EXIF, and survives junk", async () => {
    expect(await readPhotoMeta(new Blob([new Uint8Array(makeJpeg({ width: 16, height: 16 }))]))).toEqual({ takenAt: null, lat: null, lon: null });
    expect(await readPhotoMeta(new Blob(["<html>not a photo</html>"]))).toEqual({ takenAt: null, lat: null, lon: null });
  });
});

describe("answers to officers' queries (issue 18)", () => {
  it("saves the answer and its outbox entry together; an empty answer saves neither", async () => {
    const db = freshDb();
    const f = await saveFind(db, find());
    await db.outbox.clear();
    const answer = { id: newId(), findId: f.id, reviewId: newId(), note: "Re-weighed at camp." };
    await saveAnswer(db, answer);
    expect(await db.answers.get(answer.id)).toMatchObject(answer);
    expect(await db.outbox.toArray()).toMatchObject([{ name: "answer.put", args: answer, entityId: answer.id, state: "pending" }]);
    await expect(saveAnswer(db, { ...answer, id: newId(), note: "   " })).rejects.toBeInstanceOf(LocalValidationError);
    expect(await db.answers.count()).toBe(1);
    expect(await db.outbox.count()).toBe(1);
  });

  it("sends the mail-on-query setting to the club when it changes, and only then", async () => {
    const db = freshDb();
    await saveSettings(db, { mailOnQuery: false });
    expect(await db.outbox.count()).toBe(0);
    await saveSettings(db, { mailOnQuery: true });
    expect(await db.outbox.toArray()).toMatchObject([{ name: "settings.put", args: { mailOnQuery: true } }]);
    expect((await readSettings(db)).mailOnQuery).toBe(true);
  });

  it("pulls everything again after the upgrade to version 4 when reviews were stored without their time", async () => {
    const name = databaseNameFor(`upgrade-v3-${Date.now()}`);
    const v3 = new Dexie(name);
    const stores = {
      outings: "id, startedAt",
      finds: "id, foundAt, outingId, kind, claimId",
      photos: "id, findId, uploaded",
      weighIns: "id, findId",
      claims: "id",
      settings: "key",
      outbox: "++id, state, entityId",
      reviews: "id, findId",
      prices: "id, effectiveOn",
      meta: "key",
      scales: "id",
      barrenRocks: "id, claimId, weighedAt",
    };
    v3.version(3).stores(stores);
    await v3.table("reviews").add({ id: "r1", findId: "f1", action: "query", note: "Which side?", officerName: "An officer" });
    await v3.table("meta").put({ key: "cursor", value: 420 });
    v3.close();

    const v4 = new LodebookDb(name);
    await v4.open();
    expect(v4.verno).toBe(DB_VERSION);
    expect((await v4.meta.get("cursor"))?.value).toBe(0);
    expect(await v4.answers.count()).toBe(0);
    v4.close();
  });
});
