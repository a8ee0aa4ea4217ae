import { closeDb, databasePath, getDb } from "../src/server/db";
import { applyLocalDefaults } from "./lib/env";

applyLocalDefaults();
getDb(); // opening applies every pending migration from ./drizzle
closeDb();
console.log(`Database up to date: ${databasePath()}`);
