import Database from "better-sqlite3";
import crypto from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { v7 as uuidv7 } from "uuid";
import { buildApp, startApp } from "../scripts/lib/app-server";
import { launchBrowser } from "../tests/e2e/support/browser";
import { concurrency, deviceLists, estimateBrowser, memberCookie, offlineOpen, pageWeight, photoBytes } from "./browser-figures";
import { bystander, seedHeavyMembers } from "./hostile-figures";
import { lighthouseScores } from "./lighthouse-figures";
import { claimOutline, printableReport } from "./report-figures";
import { estimateNode, ledger, syncIngest } from "./node-figures";
import { photoStudy } from "./photo-figures";
import { poorLink } from "./poor-link";

// npm run bench: every figure on one run of this machine, each beside its baseline measured in
// the same run (these machines are shared and noisy). Medians of several runs, with min–max.
const started = performance.now();
console.log(`Lodebook bench · ${new Date().toISOString()} · Node ${process.version} · ${os.cpus().length} cores\n`);

// `npm run bench -- --only=poor-link,photo-study` runs just those figures (names below).
const FIGURES = [
  "sync-ingest",
  "estimate",
  "ledger",
  "claim-outline",
  "page-weight",
  "concurrency",
  "bystander",
  "report",
  "estimate-browser",
  "photo-bytes",
  "photo-study",
  "offline-open",
  "device-lists",
  "poor-link",
  "lighthouse-mobile",
  "lighthouse-desktop",
] as const;
const only = process.argv
  .find((a) => a.startsWith("--only="))
  ?.slice("--only=".length)
  .split(",");
const unknown = only?.filter((n) => !(FIGURES as readonly string[]).includes(n)) ?? [];
if (unknown.length) throw new Error(`Unknown figure ${unknown.join(", ")}; choose from ${FIGURES.join(", ")}.`);
const want = (name: (typeof FIGURES)[number]) => !only || only.includes(name);

if (want("sync-ingest")) await syncIngest();
if (want("estimate")) await estimateNode();
if (want("ledger")) await ledger();
if (want("claim-outline")) claimOutline();

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = net.createServer().listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-bench-"));
// One trusted proxy: the hostile sign-in burst comes from many addresses, as through a proxy.
const env: NodeJS.ProcessEnv = {
  ...process.env,
  NEXT_TELEMETRY_DISABLED: "1",
  DATABASE_URL: path.join(dir, "bench.db"),
  AUTH_SECRET: crypto.randomBytes(32).toString("base64url"),
  LODEBOOK_PHOTO_DIR: path.join(dir, "photos"),
  LODEBOOK_LOG: "error",
  SMTP_PORT: "1",
  LODEBOOK_TRUSTED_PROXIES: "1",
};
Object.assign(process.env, env);
const { closeDb, getDb } = await import("../src/server/db");
const { hashPassword } = await import("../src/server/auth/password");
const { seedDemoClub, DEMO_PASSWORDS } = await import("../src/server/seed/demo-club");
closeDb();
seedDemoClub(getDb(), { passwordHashes: { officer: await hashPassword(DEMO_PASSWORDS.officer), member: await hashPassword(DEMO_PASSWORDS.member) } });
const benchMembers = Array.from({ length: 50 }, (_, i) => ({ id: uuidv7(), email: `bench${i}@quillmarsh.example` }));
const insert = getDb().$client.prepare("insert into members (id, email, name, role, active) values (?, ?, ?, 'member', 1)");
for (const m of benchMembers) insert.run(m.id, m.email, m.email);
const heavyIds = want("bystander") ? seedHeavyMembers(getDb().$client, 4, 3000) : [];
closeDb();

if (!fs.existsSync(".next/BUILD_ID") || process.env.LODEBOOK_BENCH_BUILD === "1") await buildApp(env);
const appPort = await freePort();
const app = await startApp({ port: appPort, env, quiet: true });
const browser = await launchBrowser();
try {
  if (want("page-weight")) await pageWeight(app.url);
  if (want("concurrency"))
    await concurrency(app.url, benchMembers, (ids) => {
      const db = new Database(env.DATABASE_URL!, { readonly: true });
      const n = (db.prepare(`select count(*) n from finds where id in (${ids.map(() => "?").join(",")})`).get(...ids) as { n: number }).n;
      db.close();
      return n;
    });
  if (want("bystander"))
    await bystander(
      app.url,
      { id: benchMembers[0].id, cookie: await memberCookie(benchMembers[0]) },
      await Promise.all(heavyIds.map(async (id) => ({ id, cookie: await memberCookie({ id, email: "" }) }))),
    );
  const officer = getDb().$client.prepare("select id, email from members where role = 'officer' limit 1").get() as { id: string; email: string };
  const finds = (getDb().$client.prepare("select count(*) n from finds").get() as { n: number }).n;
  if (want("report")) await printableReport(app.url, await memberCookie(officer), finds);
  if (want("estimate-browser")) await estimateBrowser(browser, app.url);
  if (want("photo-bytes")) await photoBytes(browser, app.url);
  if (want("photo-study")) await photoStudy(browser, app.url);
  if (want("offline-open")) await offlineOpen(browser, app.url);
  if (want("device-lists")) await deviceLists(browser, app.url);
  if (want("poor-link")) await poorLink(browser, appPort, env.DATABASE_URL!);
  if (want("lighthouse-mobile") || want("lighthouse-desktop")) {
    const member = getDb().$client.prepare("select id, email from members where email = 'ines@quillmarsh.example'").get() as { id: string; email: string };
    await lighthouseScores(app.url, await memberCookie(member), await memberCookie(officer), {
      mobile: want("lighthouse-mobile"),
      desktop: want("lighthouse-desktop"),
    });
  }
} finally {
  await browser.close();
  await app.stop();
}
console.log(`\nDone in ${((performance.now() - started) / 1000).toFixed(0)} s.`);
