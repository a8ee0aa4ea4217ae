import Database from "better-sqlite3";
import fs from "node:fs";
import path from "node:path";
import { v7 as uuidv7 } from "uuid";
import { estimateSpecimen, estimateSpecimenMonteCarlo } from "../src/lib/estimate";
import { ledgerQuerySchema } from "../src/lib/club/ledger";
import { PROTOCOL_VERSION } from "../src/lib/sync/protocol";
import { ledgerPage } from "../src/server/club/ledger";
import { productionByMonth } from "../src/server/club/production";
import { TOTAL_COLUMN_TEXT } from "../src/server/club/totals";
import { closeDb, getDb } from "../src/server/db";
import { seedLargeClub } from "../src/server/seed/large-club";
import { applyPushGrouped } from "../src/server/sync/push";
import { repeat, report, summary } from "./stats";

const OUT = path.resolve("bench/out");

function freshDb(name: string) {
  fs.mkdirSync(OUT, { recursive: true });
  const file = path.join(OUT, name);
  for (const s of ["", "-wal", "-shm"]) fs.rmSync(file + s, { force: true });
  closeDb();
  process.env.DATABASE_URL = file;
  return { db: getDb(), file };
}

function mutationsFor(n: number) {
  const muts: { id: number; name: string; args: Record<string, unknown> }[] = [];
  const input = {
    method: "hanging" as const,
    airGrams: [100],
    waterGrams: [63.1],
    finenessPermille: 825,
    finenessRangePermille: [700, 950] as [number, number],
  };
  const deviceEstimate = estimateSpecimen(input);
  for (let i = 0; muts.length < n; i++) {
    const find = {
      id: uuidv7(),
      outingId: null,
      claimId: null,
      kind: "specimen",
      weightGrams: 100,
      depthCm: null,
      method: "detecting",
      notes: "",
      lat: 41.8,
      lon: -117.6,
      accuracyM: 5,
      locationSource: "device",
      foundAt: 1780000000000 + i,
    };
    muts.push({ id: muts.length + 1, name: "find.put", args: find });
    muts.push({ id: muts.length + 1, name: "weighIn.put", args: { id: uuidv7(), findId: find.id, input, deviceEstimate, weighedAt: 1780000000000 + i } });
  }
  return muts;
}

/** Sync ingest: 10 000 mutations through the real push logic against raw inserts of the same rows. */
export async function syncIngest() {
  const handler: number[] = [];
  const raw: number[] = [];
  // Run 0 warms the JIT on both sides (a club's server runs for days) and is not counted.
  for (let run = 0; run <= 7; run++) {
    const { db } = freshDb("ingest.db");
    db.$client.prepare("insert into members (id, email, name, role, active) values ('bench-m', 'bench@x.example', 'Bench', 'member', 1)").run();
    const actor = { id: "bench-m", email: "bench@x.example", name: "Bench", role: "member" as const };
    const muts = mutationsFor(10_000);
    const clientId = uuidv7();
    let t = performance.now();
    // Through applyPushGrouped, as the route handler does (group commit, one flush per group).
    for (let i = 0; i < muts.length; i += 500)
      await applyPushGrouped(actor, { protocolVersion: PROTOCOL_VERSION, clientId, mutations: muts.slice(i, i + 500) as never });
    if (run > 0) handler.push(performance.now() - t);
    closeDb();

    const rawFile = path.join(OUT, "ingest-raw.db");
    for (const s of ["", "-wal", "-shm"]) fs.rmSync(rawFile + s, { force: true });
    fs.copyFileSync(path.join(OUT, "ingest.db"), rawFile);
    const sqlite = new Database(rawFile);
    sqlite.pragma("journal_mode = WAL");
    sqlite.pragma("synchronous = FULL");
    sqlite.exec("delete from weigh_ins; delete from finds; delete from record_history;");
    const insertFind = sqlite.prepare(
      "insert into finds (id, member_id, kind, weight_grams, method, notes, lat, lon, accuracy_m, location_source, found_at, seq) values (?, 'bench-m', ?, ?, ?, '', ?, ?, ?, ?, ?, ?)",
    );
    const insertWeighIn = sqlite.prepare(
      "insert into weigh_ins (id, member_id, find_id, input, device_estimate, server_estimate, engine_version, fine_gold_grams, gold_alloy_grams, weighed_at, seq) values (?, 'bench-m', ?, ?, ?, ?, ?, ?, ?, ?, ?)",
    );
    t = performance.now();
    sqlite.transaction(() => {
      let seq = 0;
      for (const m of muts) {
        const a = m.args as Record<string, never>;
        if (m.name === "find.put") insertFind.run(a.id, a.kind, a.weightGrams, a.method, a.lat, a.lon, a.accuracyM, a.locationSource, a.foundAt, ++seq);
        else {
          const e = a.deviceEstimate as unknown as { engineVersion: string; fineGoldGrams: number; goldAlloyGrams: number };
          insertWeighIn.run(
            a.id,
            a.findId,
            JSON.stringify(a.input),
            JSON.stringify(e),
            JSON.stringify(e),
            e.engineVersion,
            e.fineGoldGrams,
            e.goldAlloyGrams,
            a.weighedAt,
            ++seq,
          );
        }
      }
    })();
    if (run > 0) raw.push(performance.now() - t);
    sqlite.close();
  }
  const rate = handler.map((h, i) => raw[i] / h);
  report("sync ingest (10 000 mutations, finds + weigh-ins)", {
    value: handler,
    unit: "ms through the push logic",
    ratio: rate,
    ratioLabel: "share of the raw insert rate",
    goal: "≥ 0.40 of raw (median)",
    pass: summary(rate).median >= 0.4,
  });
}

/** Ledger summary and first page over the large club (and its other sorts, and the monthly chart), against the bare SQL aggregate. */
export async function ledger() {
  const file = path.join(OUT, "large-v3.db");
  if (!fs.existsSync(file)) {
    console.log("(making the large club once: 500 members, 250 000 finds, 1 000 000 weigh-ins, 37 monthly prices…)");
    freshDb("large-v3.db");
    seedLargeClub(getDb());
  }
  closeDb();
  process.env.DATABASE_URL = file;
  const db = getDb();
  // The same summary figures, straight from SQL: count, weight, fine gold with its range, bases.
  const bareSql = db.$client.prepare(`select ${TOTAL_COLUMN_TEXT} from finds f where f.deleted_at is null and f.found_at >= ? and f.found_at < ?`);
  const bare = () => timed(() => bareSql.get(Date.UTC(2026, 0, 1), Date.UTC(2027, 0, 1)));
  // Each timing beside a bare aggregate taken just after it (side by side, as the machine drifts).
  const beside = (work: () => unknown) => {
    const value: number[] = [];
    const ratio: number[] = [];
    for (let i = 0; i < 5; i++) {
      value.push(timed(work));
      ratio.push(value[i] / bare());
    }
    return { value, ratio };
  };
  const first = beside(() => ledgerPage(ledgerQuerySchema.parse({ season: "2026" })));
  report("club ledger, one season of the large club (summary + first page)", {
    ...first,
    unit: "ms",
    ratioLabel: "× the bare SQL aggregate",
    goal: "≤ 2× and ≤ 150 ms (medians)",
    pass: summary(first.ratio).median <= 2 && summary(first.value).median <= 150,
  });
  // The console's other sorts and its monthly chart: the same season, the slowest sort shown.
  const sorts = ["weight", "fine", "member", "claim"].map((sort) => ({ sort, ...beside(() => ledgerPage(ledgerQuerySchema.parse({ season: "2026", sort }))) }));
  const slowest = sorts.reduce((a, b) => (summary(b.value).median > summary(a.value).median ? b : a));
  report(`club ledger sorted by weight, fine, member or claim (slowest: ${slowest.sort})`, {
    value: slowest.value,
    ratio: slowest.ratio,
    unit: "ms",
    ratioLabel: "× the bare SQL aggregate",
    goal: "≤ 150 ms (median)",
    pass: summary(slowest.value).median <= 150,
  });
  const chart = beside(() => productionByMonth(2026));
  report("production by month and claim, one season of the large club", {
    ...chart,
    unit: "ms",
    ratioLabel: "× the bare SQL aggregate",
    goal: "≤ 150 ms (median)",
    pass: summary(chart.value).median <= 150,
  });
  closeDb();
}

function timed(work: () => unknown): number {
  const t = performance.now();
  work();
  return performance.now() - t;
}

/** The plain estimate's cost per call, and a 10 000-sample Monte Carlo, in Node. */
export async function estimateNode() {
  const input = {
    method: "hanging" as const,
    airGrams: [100, 100.01],
    waterGrams: [62.72],
    finenessPermille: 825,
    finenessRangePermille: [700, 950] as [number, number],
  };
  const perCall = await repeat(5, () => {
    const t = performance.now();
    for (let i = 0; i < 2000; i++) estimateSpecimen(input);
    return ((performance.now() - t) / 2000) * 1000;
  });
  report("estimate, one call (Node)", { value: perCall, unit: "µs", goal: "reported", pass: true });
  const mc = await repeat(5, () => {
    const t = performance.now();
    estimateSpecimenMonteCarlo(input, 10_000, 1);
    return performance.now() - t;
  });
  report("estimate, 10 000-sample Monte Carlo (Node)", { value: mc, unit: "ms", goal: "≤ 50 ms (median)", pass: summary(mc).median <= 50 });
}
