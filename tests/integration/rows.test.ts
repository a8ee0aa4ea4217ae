import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, type Db } from "@/server/db";
import { insertRow, selectRow, updateRow } from "@/server/db/rows";
import * as t from "@/server/db/schema";
import { freshDatabase } from "../support/test-db";

// The push path's own statements (src/server/db/rows.ts) must write and read rows exactly as
// Drizzle does: the same encoding of JSON, booleans and nulls, the server's fields winning over
// the record's, keys left undefined left out, and a statement per set of keys.

let db: Db;
beforeAll(() => {
  ({ db } = freshDatabase());
  db.insert(t.members).values({ id: "m1", email: "m1@example.invalid", name: "M", role: "member" }).run();
  db.insert(t.finds).values({ id: "f1", memberId: "m1", kind: "specimen", method: "detecting", foundAt: 1, seq: 1 }).run();
});
afterAll(() => closeDb());

const input = { method: "hanging", airGrams: [20], waterGrams: [12.5] };
const estimate = { fineGoldGrams: 1.25, range: { fineGoldGrams: [1, 1.5] } };

describe("rows written on the push path", () => {
  it("equal what Drizzle reads back, JSON and booleans decoded, the server's fields winning", () => {
    insertRow(
      db.$client,
      t.weighIns,
      { id: "w1", findId: "f1", input, deviceEstimate: estimate, weighedAt: 5, scaleId: undefined, memberId: "forged" },
      { memberId: "m1", serverEstimate: estimate, mismatch: true, scaleCheckPassed: null, seq: 2 },
    );
    const viaDrizzle = db.select().from(t.weighIns).where(eq(t.weighIns.id, "w1")).get()!;
    expect(viaDrizzle).toMatchObject({ memberId: "m1", input, deviceEstimate: estimate, serverEstimate: estimate, mismatch: true, scaleId: null, seq: 2 });
    expect(selectRow(db.$client, t.weighIns, "w1")).toEqual(viaDrizzle);
    // The same object in two columns is stored twice, alike.
    const raw = db.$client.prepare("select device_estimate, server_estimate from weigh_ins where id = 'w1'").get() as Record<string, string>;
    expect(raw.device_estimate).toBe(JSON.stringify(estimate));
    expect(raw.server_estimate).toBe(raw.device_estimate);
  });

  it("update only the keys given, with a statement per set of keys", () => {
    updateRow(db.$client, t.weighIns, "w1", { weighedAt: 9 }, { mismatch: false, seq: 3 });
    updateRow(db.$client, t.weighIns, "w1", { input: { ...input, airGrams: [21] } }, { seq: 4 });
    const row = db.select().from(t.weighIns).where(eq(t.weighIns.id, "w1")).get()!;
    expect(row).toMatchObject({ weighedAt: 9, mismatch: false, input: { ...input, airGrams: [21] }, deviceEstimate: estimate, seq: 4 });
  });

  it("say nothing of a row that is not there", () => {
    expect(selectRow(db.$client, t.weighIns, "nope")).toBeUndefined();
  });
});
