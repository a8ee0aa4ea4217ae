import { getTableColumns } from "drizzle-orm";
import type { SQLiteColumn, SQLiteTable } from "drizzle-orm/sqlite-core";
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { answerSchema } from "@/lib/entities/answer";
import { barrenRockSchema } from "@/lib/entities/barren-rock";
import { claimViewSchema } from "@/lib/entities/claim";
import { findSchema } from "@/lib/entities/find";
import { outingSchema } from "@/lib/entities/outing";
import { photoSchema } from "@/lib/entities/photo";
import { scaleSchema } from "@/lib/entities/scale";
import { weighInSchema } from "@/lib/entities/weigh-in";
import { REVIEW_STATES } from "@/lib/club/ledger";
import { FINENESS_USED_BASES, LOCATION_SHARING, RECOVERY_KINDS, REVIEW_ACTIONS, ROYALTY_KINDS } from "@/lib/entities/constants";
import { ROLES } from "@/lib/roles";
import * as t from "@/server/db/schema";

// A record's shape is written twice, on purpose: the zod entity in src/lib (shared with the
// devices, which must not carry the database schema) and the Drizzle table on the server. This
// holds them together: every field a device sends is a column of its table, nullable exactly
// when the entity allows null, and every fixed list of values is the same list.

const PAIRS: [string, z.ZodObject, SQLiteTable][] = [
  ["outing", outingSchema, t.outings],
  ["find", findSchema as unknown as z.ZodObject, t.finds],
  ["photo", photoSchema, t.photos],
  ["weighIn", weighInSchema, t.weighIns],
  ["scale", scaleSchema, t.scales],
  ["barrenRock", barrenRockSchema, t.barrenRocks],
  ["answer", answerSchema, t.answers],
  ["claim", claimViewSchema, t.claims],
];

/** The zod type under optional/default/nullable wrappers, and whether null is allowed. */
function unwrap(type: z.ZodType): { inner: z.ZodType; nullable: boolean } {
  let inner = type;
  let nullable = false;
  for (;;) {
    if (inner instanceof z.ZodNullable) nullable = true;
    else if (!(inner instanceof z.ZodOptional || inner instanceof z.ZodDefault || inner instanceof z.ZodPipe)) return { inner, nullable };
    inner = inner instanceof z.ZodPipe ? (inner.def.in as z.ZodType) : (inner.def as unknown as { innerType: z.ZodType }).innerType;
  }
}

// Columns that allow null where the entity never sends it: safe (the database is the looser of
// the two), and listed so that a new one is a decision, not drift. Both were nullable from
// their first migration; making them NOT NULL means rebuilding the table.
const LOOSER_COLUMNS = ["barrenRock.deviceDensity", "photo.height", "photo.width", "weighIn.deviceEstimate"];
const looser: string[] = [];

describe("entity schemas and database tables", () => {
  for (const [entity, schema, table] of PAIRS) {
    it(`${entity}: every field is a column, nullable alike, with the same fixed values`, () => {
      const columns = getTableColumns(table) as Record<string, SQLiteColumn>;
      for (const [key, field] of Object.entries(schema.shape)) {
        const column = columns[key];
        expect(column, `${entity}.${key} has no column`).toBeDefined();
        const { inner, nullable } = unwrap(field as z.ZodType);
        // A field the entity leaves optional (no null, no default) may still be filled by the server.
        const optionalOnly = (field as z.ZodType) instanceof z.ZodOptional && !nullable;
        if (nullable) expect(column.notNull, `${entity}.${key}: the entity allows null, so must the column`).toBe(false);
        else if (!optionalOnly && !column.notNull) looser.push(`${entity}.${key}`);
        if (inner instanceof z.ZodEnum) expect([...(column.enumValues ?? [])].sort(), `${entity}.${key} values`).toEqual([...inner.options].sort());
      }
    });
  }

  it("only the listed columns are looser than their entity", () => {
    expect(looser.sort(), JSON.stringify(looser)).toEqual(LOOSER_COLUMNS);
  });

  it("tables that are no entity's take their lists from src/lib too", () => {
    expect(t.finds.reviewState.enumValues).toEqual([...REVIEW_STATES]);
    expect(t.members.role.enumValues).toEqual([...ROLES]);
    expect(t.invitations.role.enumValues).toEqual([...ROLES]);
    expect(t.members.locationSharing.enumValues).toEqual([...LOCATION_SHARING]);
    expect(t.reviews.action.enumValues).toEqual([...REVIEW_ACTIONS]);
    expect(t.recoveries.kind.enumValues).toEqual([...RECOVERY_KINDS]);
    expect(t.claims.royaltyKind.enumValues).toEqual([...ROYALTY_KINDS]);
    expect(t.finds.finenessUsedBasis.enumValues).toEqual([...FINENESS_USED_BASES]);
  });
});
