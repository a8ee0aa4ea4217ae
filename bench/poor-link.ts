import Database from "better-sqlite3";
import { build } from "esbuild";
import type { Browser } from "playwright-core";
import { startShapedLink } from "../tests/support/shaped-link";
import { signIn } from "./browser-figures";
import { report } from "./stats";

type DayPage = typeof import("./day-page");
const LINK = { upBps: 1_000_000, downBps: 5_000_000, rttMs: 600 };
const GIVE_UP_MS = 420_000;

type Run = { seconds: number; upBytes: number; downBytes: number; photoBytes: number; onServer: { finds: number; weighIns: number; photos: number } };

/**
 * One member's day of work (30 finds, 60 photos from 12 MP camera JPEGs shrunk by the app's own
 * code, 40 weigh-ins) written on the device, then camp sync over the shaped link, from opening
 * the camp-sync screen until the server holds all of it. `cuts` times, at even steps through
 * the photos' bytes, every connection is dropped and the link is down for 2 s.
 */
async function dayOverPoorLink(browser: Browser, appPort: number, databaseUrl: string, email: string, cuts: number): Promise<Run> {
  const link = await startShapedLink({ targetPort: appPort, ...LINK });
  link.shaping = false; // signing in and the first sync of the club's data are not timed
  const base = `http://localhost:${link.port}`;
  const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
  try {
    const page = await context.newPage();
    await signIn(page, base, email, "member-demo-pass");
    const memberId = (await page.evaluate(() => JSON.parse(localStorage.getItem("lodebook-member")!) as { id: string })).id;
    await page.goto(`${base}/about`); // a page that does not sync while the day is written
    const bundle = await build({
      entryPoints: ["bench/day-page.ts"],
      bundle: true,
      format: "iife",
      globalName: "lodebookBenchDay",
      write: false,
      platform: "browser",
      tsconfig: "tsconfig.json",
      logLevel: "silent",
    });
    await page.addScriptTag({ content: bundle.outputFiles[0].text });
    const writing = performance.now();
    const day = await page.evaluate((id) => (window as unknown as { lodebookBenchDay: DayPage }).lodebookBenchDay.writeDayOfWork(id), memberId);

    console.log(`        (${email}: the day written on the device in ${((performance.now() - writing) / 1000).toFixed(0)} s, not timed)`);
    link.shaping = true;
    const before = { ...link.bytes };
    for (let k = 1; k <= cuts; k++) link.onUpBytes(before.up + (day.photoBytes * k) / (cuts + 1), () => link.cut(2000));
    const server = new Database(databaseUrl, { readonly: true, fileMustExist: true });
    const ids = JSON.stringify(day.findIds);
    const count = () =>
      server
        .prepare(
          `select (select count(*) from finds where id in (select value from json_each(@ids)) and deleted_at is null) finds,
                  (select count(*) from weigh_ins where find_id in (select value from json_each(@ids)) and deleted_at is null) weighIns,
                  (select count(*) from photos where find_id in (select value from json_each(@ids)) and storage_key is not null) photos`,
        )
        .get({ ids }) as Run["onServer"];
    const started = performance.now();
    await page.goto(`${base}/sync`);
    let onServer = count();
    while (!(onServer.finds === 30 && onServer.weighIns === 40 && onServer.photos === 60) && performance.now() - started < GIVE_UP_MS) {
      await new Promise((r) => setTimeout(r, 250));
      onServer = count();
    }
    const seconds = (performance.now() - started) / 1000;
    server.close();
    return { seconds, upBytes: link.bytes.up - before.up, downBytes: link.bytes.down - before.down, photoBytes: day.photoBytes, onServer };
  } finally {
    await context.close();
    await link.close();
  }
}

/**
 * Camp sync of a day's work over a poor link (issue 17): 1 Mbit/s up, 5 Mbit/s down, 600 ms
 * round trip, through a loopback proxy the bench starts and stops; then the same day again with
 * the link cut twice mid-photo, its bytes against the clean run's.
 */
export async function poorLink(browser: Browser, appPort: number, databaseUrl: string) {
  const clean = await dayOverPoorLink(browser, appPort, databaseUrl, "tobias@quillmarsh.example", 0);
  const all = (r: Run) => r.onServer.finds === 30 && r.onServer.weighIns === 40 && r.onServer.photos === 60;
  const mb = (n: number) => (n / 1024 / 1024).toFixed(1);
  const what = (r: Run) =>
    `${r.onServer.finds}/30 finds, ${r.onServer.weighIns}/40 weigh-ins, ${r.onServer.photos}/60 photos on the server; ${mb(r.upBytes)} MB up (photos ${mb(r.photoBytes)} MB), ${mb(r.downBytes)} MB down`;
  report(`a day's work over a poor link, 1 Mbit/s up, 5 down, 600 ms round trip (${what(clean)})`, {
    value: [clean.seconds],
    unit: "s until all is on the server",
    ratio: [clean.seconds / 120],
    ratioLabel: "× the goal",
    goal: "≤ 120 s",
    pass: all(clean) && clean.seconds <= 120,
  });
  const cut = await dayOverPoorLink(browser, appPort, databaseUrl, "priya@quillmarsh.example", 2);
  const extra = cut.upBytes / clean.upBytes;
  report(`the same day with the link cut twice mid-photo (${what(cut)}; ${cut.seconds.toFixed(0)} s)`, {
    value: [cut.upBytes / 1024 / 1024],
    unit: "MB up",
    ratio: [extra],
    ratioLabel: "× the uncut day's bytes",
    goal: "≤ 1.15×",
    pass: all(cut) && extra <= 1.15,
  });
}
