import path from "node:path";
import { closeDb, databasePath } from "../src/server/db";
import { backupTo, integrityCheck } from "../src/server/backup";
import { applyLocalDefaults } from "./lib/env";

// npm run backup [-- file]: a consistent copy while the server runs (SQLite online backup).
applyLocalDefaults();
const file = path.resolve(process.argv[2] ?? `data/backups/lodebook-${new Date().toISOString().replace(/[:.]/g, "-")}.db`);
await backupTo(file);
closeDb();
console.log(`Backed up ${databasePath()} to ${file} (integrity: ${integrityCheck(file)}).`);
