import { closeDb } from "../src/server/db";
import { sendDigest } from "../src/server/club/digest";
import { applyLocalDefaults } from "./lib/env";

// npm run digest: the weekly e-mail to officers (new finds, open queries), through the same mailer.
applyLocalDefaults();
const sent = await sendDigest();
closeDb();
console.log(`Digest sent to ${sent} officer${sent === 1 ? "" : "s"}.`);
