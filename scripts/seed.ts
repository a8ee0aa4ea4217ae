import { parseArgs } from "node:util";
import { closeDb, getDb } from "../src/server/db";
import { hashPassword } from "../src/server/auth/password";
import { writeDemoBasemap } from "../src/server/seed/demo-basemap";
import { DEMO_PASSWORDS, seedDemoClub } from "../src/server/seed/demo-club";
import { seedLargeClub } from "../src/server/seed/large-club";
import { applyLocalDefaults } from "./lib/env";

// npm run db:seed [-- --size large]: the demo club, or a large invented club for benchmarks.
const { values } = parseArgs({ options: { size: { type: "string", default: "demo" } } });
applyLocalDefaults();
if (values.size === "large") {
  const started = performance.now();
  const members = seedLargeClub(getDb());
  console.log(`Seeded a large club: ${members.length} members, 250 000 finds, 1 000 000 weigh-ins in ${((performance.now() - started) / 1000).toFixed(1)} s.`);
} else {
  const result = seedDemoClub(getDb(), {
    passwordHashes: { officer: await hashPassword(DEMO_PASSWORDS.officer), member: await hashPassword(DEMO_PASSWORDS.member) },
  });
  const basemapBytes = result.seeded ? await writeDemoBasemap() : 0;
  console.log(
    result.seeded
      ? `Seeded the demo club: ${result.members} people, ${result.finds} finds, ${result.weighIns} weigh-ins, a ${Math.ceil(basemapBytes / 1024)} kB invented basemap.`
      : "The demo club is already there; nothing changed.",
  );
}
closeDb();
