import { closeDb, getDb } from "../src/server/db";
import { hashPassword } from "../src/server/auth/password";
import { DEMO_PASSWORDS, seedDemoClub } from "../src/server/seed/demo-club";
import { applyLocalDefaults } from "./lib/env";

applyLocalDefaults();
const result = seedDemoClub(getDb(), {
  passwordHashes: { officer: await hashPassword(DEMO_PASSWORDS.officer), member: await hashPassword(DEMO_PASSWORDS.member) },
});
closeDb();
console.log(result.seeded ? `Seeded the demo club: ${result.members} people, ${result.finds} finds, ${result.weighIns} weigh-ins.` : "The demo club is already there; nothing changed.");
