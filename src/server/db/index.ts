import "server-only";
import { serverEnv } from "../env";
import Database from "better-sqlite3";
import { drizzle, type BetterSQLite3Database } from "drizzle-orm/better-sqlite3";
import { migrate } from "drizzle-orm/better-sqlite3/migrator";
import fs from "node:fs";
import path from "node:path";
import { backfillOutsideClaim } from "./outside-claim";
import * as schema from "./schema";

export type Db = BetterSQLite3Database<typeof schema> & { $client: Database.Database };

let instance: Db | undefined;

export function databasePath(): string {
  const url = serverEnv().DATABASE_URL;
  return path.resolve(url.replace(/^file:/, ""));
}

export function migrationsFolder(): string {
  return path.resolve(serverEnv().LODEBOOK_MIGRATIONS);
}

/** Opens a connection with the pragmas every connection needs, and brings the schema up to date. */
export function openDatabase(file = databasePath()): Db {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const sqlite = new Database(file);
  sqlite.pragma("journal_mode = WAL");
  // FULL: an acknowledged sync batch survives power loss, not just a process crash.
  sqlite.pragma("synchronous = FULL");
  sqlite.pragma("foreign_keys = ON");
  sqlite.pragma("busy_timeout = 5000");
  sqlite.pragma("temp_store = MEMORY");
  const db = drizzle(sqlite, { schema }) as Db;
  migrate(db, { migrationsFolder: migrationsFolder() });
  backfillOutsideClaim(sqlite);
  return db;
}

/** The shared connection, opened on first use so that `next build` never touches the file. */
export function getDb(): Db {
  instance ??= openDatabase();
  return instance;
}

/** For tests and scripts that move between database files. */
export function closeDb(): void {
  instance?.$client.close();
  instance = undefined;
}

export { schema };
