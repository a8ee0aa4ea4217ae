import { databasePath } from "../src/server/db";
import { restoreFrom } from "../src/server/backup";
import { applyLocalDefaults } from "./lib/env";

// npm run restore -- file: stop the server first; the backup replaces the database file.
applyLocalDefaults();
const file = process.argv[2];
if (!file) {
  console.error("Name the backup file: npm run restore -- data/backups/….db");
  process.exit(2);
}
restoreFrom(file, databasePath());
console.log(`Restored ${file} to ${databasePath()}. Start the server again; devices will notice and resend what it lacks.`);
