import path from "node:path";
import { closeDb, getDb } from "../src/server/db";
import { hashPassword } from "../src/server/auth/password";
import { writeDemoBasemap } from "../src/server/seed/demo-basemap";
import { DEMO_PASSWORDS, seedDemoClub } from "../src/server/seed/demo-club";
import { DEMO_CLUB, DEMO_PEOPLE } from "../src/server/seed/people";
import { buildApp, startApp } from "./lib/app-server";
import { applyLocalDefaults } from "./lib/env";
import { startMailCatcher } from "./lib/mail-catcher";

// npm run demo: migrate, seed if empty, build, then serve the app with its local stand-ins.
applyLocalDefaults();
const port = Number(process.env.PORT ?? 3000);
// Every link in mail (sign-in, invitations) is built from this, never from the request.
process.env.LODEBOOK_ORIGIN ??= `http://localhost:${port}`;
const mailDir = path.resolve("data/mail");
process.env.LODEBOOK_MAIL_DIR ??= mailDir;

const seeded = seedDemoClub(getDb(), {
  passwordHashes: { officer: await hashPassword(DEMO_PASSWORDS.officer), member: await hashPassword(DEMO_PASSWORDS.member) },
});
// The club's invented basemap, beside the database, made with the club (an officer may replace or remove it).
const basemapBytes = seeded.seeded ? await writeDemoBasemap() : 0;
closeDb();
console.log(seeded.seeded ? `Seeded ${DEMO_CLUB}: ${seeded.finds} finds, ${seeded.weighIns} weigh-ins.` : `${DEMO_CLUB} is already in the database.`);
if (basemapBytes) console.log(`Wrote its invented basemap (${Math.ceil(basemapBytes / 1024)} kB) beside the database.`);

if (process.env.LODEBOOK_SKIP_BUILD !== "1") await buildApp();
const mail = await startMailCatcher({ port: Number(process.env.SMTP_PORT), dir: process.env.LODEBOOK_MAIL_DIR });
const app = await startApp({ port, env: process.env });

const officer = DEMO_PEOPLE.find((p) => p.role === "officer")!;
const member = DEMO_PEOPLE.find((p) => p.role === "member")!;
console.log(`
Lodebook is running at ${app.url}

  Club officer  ${officer.email}  password: ${DEMO_PASSWORDS.officer}
  Member        ${member.email}  password: ${DEMO_PASSWORDS.member}
  (every demo person has the password of their role; see the club console's roll)

  Mail catcher  SMTP on 127.0.0.1:${process.env.SMTP_PORT}; messages at ${app.url}/club/mail (officers)
  Database      ${process.env.DATABASE_URL}

Press Ctrl+C to stop.`);

const shutdown = async () => {
  await app.stop();
  await mail.close();
  process.exit(0);
};
process.on("SIGINT", shutdown);
process.on("SIGTERM", shutdown);
