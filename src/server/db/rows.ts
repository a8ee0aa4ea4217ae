import "server-only";
import type Database from "better-sqlite3";
import { getTableColumns, getTableName } from "drizzle-orm";
import type { SQLiteColumn, SQLiteTable } from "drizzle-orm/sqlite-core";

/**
 * Statements prepared once per connection, for the push path only (everywhere else uses
 * Drizzle). Drizzle compiles and prepares every query anew, which was nine tenths of a push's
 * cost. Its own prepared statements (`.prepare()` with `sql.placeholder`, one per set of keys,
 * values encoded by the same columns) were tried on 2026-12-04: sync ingest took 754 and 775 ms
 * against 666 and 540 ms here, 0.48–0.51 of the raw insert rate against 0.55–0.72, beyond the
 * 10 % the issue allowed, so this stays. Column names and value encoding still come from the
 * Drizzle schema; tests/integration/rows.test.ts holds what it writes equal to Drizzle's reads.
 */
export type Sqlite = Database.Database;

type Prepared = { byText: Map<string, Database.Statement>; shapes: Map<SQLiteTable, { insert: Shape[]; update: Shape[] }> };
const cache = new WeakMap<Sqlite, Prepared>();

function preparedOf(sqlite: Sqlite): Prepared {
  let p = cache.get(sqlite);
  if (!p) cache.set(sqlite, (p = { byText: new Map(), shapes: new Map() }));
  return p;
}

export function statement(sqlite: Sqlite, text: string): Database.Statement {
  const { byText } = preparedOf(sqlite);
  let stmt = byText.get(text);
  if (!stmt) byText.set(text, (stmt = sqlite.prepare(text)));
  return stmt;
}

type Columns = { table: string; all: [string, SQLiteColumn][]; byKey: Map<string, SQLiteColumn> };
/** One set of row keys and the statement written for it (rows of one entity share their keys). */
type Shape = { keys: string[]; cols: (SQLiteColumn | undefined)[]; stmt: Database.Statement };
const columnsOf = new WeakMap<SQLiteTable, Columns>();

function columns(table: SQLiteTable): Columns {
  let c = columnsOf.get(table);
  if (!c) {
    const all = Object.entries(getTableColumns(table)) as [string, SQLiteColumn][];
    columnsOf.set(table, (c = { table: getTableName(table), all, byKey: new Map(all) }));
  }
  return c;
}

/**
 * A row comes as the record's own values plus the server's (owner, sequence, times), kept in
 * two objects: spreading them into one made a new object shape per entity at one site, and V8
 * then defined each added property through its slow generic path, on every change of a push.
 */
type Extra = Record<string, unknown> | undefined;

function definedKeys(row: Record<string, unknown>, extra: Extra): string[] {
  const keys = Object.keys(row).filter((k) => row[k] !== undefined && !(extra && k in extra));
  if (extra) for (const k of Object.keys(extra)) if (extra[k] !== undefined) keys.push(k);
  return keys;
}

/** The row's defined keys in order are the shape's keys (no string building on the hot path). */
function matches(shape: Shape, row: Record<string, unknown>, extra: Extra): boolean {
  let i = 0;
  for (const key in row) {
    if (row[key] === undefined || (extra && key in extra)) continue;
    if (shape.keys[i++] !== key) return false;
  }
  if (extra) {
    for (const key in extra) {
      if (extra[key] === undefined) continue;
      if (shape.keys[i++] !== key) return false;
    }
  }
  return i === shape.keys.length;
}

function shapeFor(sqlite: Sqlite, table: SQLiteTable, kind: "insert" | "update", row: Record<string, unknown>, extra: Extra): Shape {
  const c = columns(table);
  const { shapes } = preparedOf(sqlite);
  let byKind = shapes.get(table);
  if (!byKind) shapes.set(table, (byKind = { insert: [], update: [] }));
  const list = byKind[kind];
  for (const shape of list) if (matches(shape, row, extra)) return shape;
  const keys = definedKeys(row, extra);
  const cols = keys.map((k) => c.byKey.get(k));
  const names = cols.filter((col) => col !== undefined).map((col) => `"${col.name}"`);
  const text =
    kind === "insert"
      ? `insert into "${c.table}" (${names.join(", ")}) values (${names.map(() => "?").join(", ")})`
      : `update "${c.table}" set ${names.map((n) => `${n} = ?`).join(", ")} where "id" = ?`;
  const shape = { keys, cols, stmt: sqlite.prepare(text) };
  list.push(shape);
  return shape;
}

/**
 * Values for the shape's columns, encoded as Drizzle would (JSON, booleans). One object in
 * two columns of a row (a weigh-in's device and server estimates, when equal) is encoded once.
 */
function encode(shape: Shape, row: Record<string, unknown>, extra: Extra): unknown[] {
  const values: unknown[] = [];
  let lastObject: unknown;
  let lastEncoded: unknown;
  for (let i = 0; i < shape.keys.length; i++) {
    const col = shape.cols[i];
    if (!col) continue;
    const key = shape.keys[i];
    const value = extra && key in extra ? extra[key] : row[key];
    if (value === null) values.push(null);
    else if (typeof value !== "object") values.push(col.mapToDriverValue(value));
    else if (value === lastObject) values.push(lastEncoded);
    else values.push((lastEncoded = col.mapToDriverValue((lastObject = value))));
  }
  return values;
}

/** Inserts the row; `extra`'s values (the server's fields) are added to it and win over the row's. */
export function insertRow(sqlite: Sqlite, table: SQLiteTable, row: Record<string, unknown>, extra?: Record<string, unknown>): void {
  const shape = shapeFor(sqlite, table, "insert", row, extra);
  shape.stmt.run(...encode(shape, row, extra));
}

export function updateRow(sqlite: Sqlite, table: SQLiteTable, id: string, row: Record<string, unknown>, extra?: Record<string, unknown>): void {
  const shape = shapeFor(sqlite, table, "update", row, extra);
  shape.stmt.run(...encode(shape, row, extra), id);
}

/** One row by id, decoded into the schema's keys (the shape a Drizzle select returns). */
export function selectRow<T = Record<string, unknown>>(sqlite: Sqlite, table: SQLiteTable, id: string): T | undefined {
  const c = columns(table);
  const raw = statement(sqlite, `select * from "${c.table}" where "id" = ?`).get(id) as Record<string, unknown> | undefined;
  if (!raw) return undefined;
  const row: Record<string, unknown> = {};
  for (const [key, col] of c.all) {
    const value = raw[col.name];
    row[key] = value === null || value === undefined ? null : col.mapFromDriverValue(value);
  }
  return row as T;
}
