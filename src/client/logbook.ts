import { v7 as uuidv7 } from "uuid";
import type { Answer } from "@/lib/entities/answer";
import type { BarrenRock } from "@/lib/entities/barren-rock";
import type { Find } from "@/lib/entities/find";
import type { Outing } from "@/lib/entities/outing";
import type { Scale, SetupCheck } from "@/lib/entities/scale";
import type { WeighIn } from "@/lib/entities/weigh-in";
import type { MutationArgs, MutationName } from "@/lib/sync/mutations";
import type { LodebookDb, OutboxEntry } from "./device-db";

export { LocalValidationError } from "./local-validation-error";

type Validation = typeof import("./validation");
let validation: Validation | undefined;

/**
 * The validator, loaded once and on demand: every write awaits this before its transaction
 * opens (an IndexedDB transaction cannot wait for a module to load).
 */
export async function loadValidation(): Promise<Validation> {
  return (validation ??= await import("./validation"));
}

function loaded(): Validation {
  if (!validation) throw new Error("loadValidation() must be awaited before a logbook transaction");
  return validation;
}

/** Queues a change for camp sync. Call only inside a transaction that also writes the record. */
export async function enqueue<N extends MutationName>(db: LodebookDb, name: N, args: MutationArgs<N>, entityId: string) {
  const entry: OutboxEntry = { name, args: loaded().checkArgs(name, args), entityId, createdAt: Date.now(), state: "pending" };
  // A newer change to the same record supersedes one the server refused earlier.
  await db.outbox
    .where("entityId")
    .equals(entityId)
    .filter((e) => e.state === "rejected")
    .delete();
  return db.outbox.add(entry);
}

export const newId = () => uuidv7();

// Each write below puts the record and its outbox entry in one transaction: both or neither.

export async function saveOuting(db: LodebookDb, outing: Outing): Promise<Outing> {
  const value = (await loadValidation()).checkRecord("outing", outing);
  await db.transaction("rw", db.outings, db.outbox, async () => {
    await db.outings.put({ ...value, updatedAt: Date.now() });
    await enqueue(db, "outing.put", value, value.id);
  });
  return value;
}

export async function startOuting(db: LodebookDb, fields: Pick<Outing, "claimId" | "method"> & Partial<Outing>): Promise<Outing> {
  return saveOuting(db, { id: newId(), startedAt: Date.now(), endedAt: null, companions: "", hours: null, conditions: "", notes: "", ...fields });
}

export async function endOuting(db: LodebookDb, outing: Outing, at = Date.now()): Promise<Outing> {
  const hours = outing.hours ?? Math.round(((at - outing.startedAt) / 3_600_000) * 10) / 10;
  return saveOuting(db, { ...outing, endedAt: Math.max(at, outing.startedAt), hours });
}

export async function deleteOuting(db: LodebookDb, id: string): Promise<void> {
  await loadValidation();
  await db.transaction("rw", db.outings, db.finds, db.outbox, async () => {
    // Finds stay: they lose their outing, not their record.
    const orphans = await db.finds.where("outingId").equals(id).toArray();
    for (const f of orphans) {
      const updated = { ...stripLocal(f), outingId: null };
      await db.finds.put({ ...updated, updatedAt: Date.now() });
      await enqueue(db, "find.put", updated, f.id);
    }
    await db.outings.delete(id);
    await enqueue(db, "outing.delete", { id }, id);
  });
}

export async function saveFind(db: LodebookDb, find: Find): Promise<Find> {
  const value = (await loadValidation()).checkRecord("find", find);
  await db.transaction("rw", db.finds, db.outbox, async () => {
    await db.finds.put({ ...value, updatedAt: Date.now() });
    await enqueue(db, "find.put", value, value.id);
  });
  return value;
}

export async function deleteFind(db: LodebookDb, id: string): Promise<void> {
  await loadValidation();
  await db.transaction("rw", [db.finds, db.photos, db.weighIns, db.outbox], async () => {
    for (const p of await db.photos.where("findId").equals(id).toArray()) {
      await db.photos.delete(p.id);
      await enqueue(db, "photo.delete", { id: p.id }, p.id);
    }
    for (const w of await db.weighIns.where("findId").equals(id).toArray()) {
      await db.weighIns.delete(w.id);
      await enqueue(db, "weighIn.delete", { id: w.id }, w.id);
    }
    await db.finds.delete(id);
    await enqueue(db, "find.delete", { id }, id);
  });
}

export async function saveWeighIn(db: LodebookDb, weighIn: WeighIn): Promise<WeighIn> {
  const value = (await loadValidation()).checkRecord("weighIn", weighIn);
  await db.transaction("rw", db.weighIns, db.outbox, async () => {
    await db.weighIns.put({ ...value, updatedAt: Date.now() });
    await enqueue(db, "weighIn.put", value, value.id);
  });
  return value;
}

export async function deleteWeighIn(db: LodebookDb, id: string): Promise<void> {
  await loadValidation();
  await db.transaction("rw", db.weighIns, db.outbox, async () => {
    await db.weighIns.delete(id);
    await enqueue(db, "weighIn.delete", { id }, id);
  });
}

export async function saveScale(db: LodebookDb, scale: Scale): Promise<Scale> {
  const value = (await loadValidation()).checkRecord("scale", scale);
  await db.transaction("rw", db.scales, db.outbox, async () => {
    await db.scales.put({ ...value, updatedAt: Date.now() });
    await enqueue(db, "scale.put", value, value.id);
  });
  return value;
}

/** A setup check joins its scale's history; the scale goes to the club with it. */
export async function addSetupCheck(db: LodebookDb, scaleId: string, check: SetupCheck): Promise<Scale> {
  const scale = await db.scales.get(scaleId);
  if (!scale) throw new Error("That scale is not on this device.");
  return saveScale(db, { ...stripLocal(scale), checks: [...scale.checks, check] });
}

/** The scale goes; weigh-ins made on it keep its id and the check they recorded. */
export async function deleteScale(db: LodebookDb, id: string): Promise<void> {
  await loadValidation();
  await db.transaction("rw", db.scales, db.outbox, async () => {
    await db.scales.delete(id);
    await enqueue(db, "scale.delete", { id }, id);
  });
}

export async function saveBarrenRock(db: LodebookDb, piece: BarrenRock): Promise<BarrenRock> {
  const value = (await loadValidation()).checkRecord("barrenRock", piece);
  await db.transaction("rw", db.barrenRocks, db.outbox, async () => {
    await db.barrenRocks.put({ ...value, updatedAt: Date.now() });
    await enqueue(db, "barrenRock.put", value, value.id);
  });
  return value;
}

export async function deleteBarrenRock(db: LodebookDb, id: string): Promise<void> {
  await loadValidation();
  await db.transaction("rw", db.barrenRocks, db.outbox, async () => {
    await db.barrenRocks.delete(id);
    await enqueue(db, "barrenRock.delete", { id }, id);
  });
}

/** The member's answer to an officer's query: the member's own record, synced like any change. */
export async function saveAnswer(db: LodebookDb, answer: Answer): Promise<Answer> {
  const value = (await loadValidation()).checkRecord("answer", answer);
  await db.transaction("rw", db.answers, db.outbox, async () => {
    await db.answers.put({ ...value, updatedAt: Date.now() });
    await enqueue(db, "answer.put", value, value.id);
  });
  return value;
}

export async function deletePhoto(db: LodebookDb, id: string): Promise<void> {
  await loadValidation();
  await db.transaction("rw", db.photos, db.outbox, async () => {
    await db.photos.delete(id);
    await enqueue(db, "photo.delete", { id }, id);
  });
}

/** The record as it syncs: without the device-only fields. */
/** A device record as the server takes it: without the device's own fields. */
export function stripLocal<T extends { updatedAt: number; figure?: unknown }>(record: T): Omit<T, "updatedAt" | "figure"> {
  const { updatedAt: _updatedAt, figure: _figure, ...rest } = record;
  return rest;
}

export function pendingCount(db: LodebookDb): Promise<number> {
  return db.outbox.where("state").equals("pending").count();
}

/** The member lets go of a change the server refused; the record stays as it is on the device. */
export async function discardRefusedChange(db: LodebookDb, outboxId: number): Promise<void> {
  await db.outbox
    .where("id")
    .equals(outboxId)
    .filter((e) => e.state === "rejected")
    .delete();
}
