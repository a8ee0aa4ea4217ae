import "server-only";
import { v7 as uuidv7 } from "uuid";
import { estimateSpecimen } from "@/lib/estimate";
import { FINENESS_PRESETS } from "@/lib/estimate/presets";
import { seededRandom } from "@/lib/estimate/uncertainty";
import type { Db } from "../db";
import { refreshAllFigures } from "../club/figures";
import { claimPolygon } from "./demo-club";

export type LargeClubSize = { members: number; finds: number; weighIns: number; claims: number; priceMonths: number };
/** Three seasons of finds, with a reference price set on the first of every month (as a club that keeps it current would). */
export const LARGE_CLUB: LargeClubSize = { members: 500, finds: 250_000, weighIns: 1_000_000, claims: 20, priceMonths: 37 };

/**
 * An invented large club for benchmarks: members, claims, finds and weigh-ins written in one
 * transaction through prepared statements. Weigh-ins reuse a few computed estimates (the
 * arithmetic is not what is measured here). Returns the member ids.
 */
export function seedLargeClub(db: Db, size: LargeClubSize = LARGE_CLUB, passwordHash = "!"): string[] {
  const sqlite = db.$client;
  const rand = seededRandom(424242);
  const now = Date.UTC(2026, 10, 1);
  const ids = (n: number, at: (i: number) => number) =>
    Array.from({ length: n }, (_, i) => uuidv7({ msecs: at(i), random: Uint8Array.from({ length: 16 }, () => Math.floor(rand() * 256)) }));
  const memberIds = ids(size.members, () => now - 900 * 86_400_000);
  const claimIds = ids(size.claims, () => now - 800 * 86_400_000);
  const estimates = [0.5, 0.9, 1.4, 2.2].map((f) => {
    const natural = FINENESS_PRESETS[0];
    const input = {
      method: "hanging" as const,
      airGrams: [100],
      waterGrams: [62.5 + f],
      finenessPermille: natural.fineness,
      finenessRangePermille: natural.range,
      airBuoyancyCorrection: true,
    };
    return { input: JSON.stringify(input), estimate: estimateSpecimen(input) };
  });
  let seq = (sqlite.prepare("select coalesce(max(value), 0) v from sequences where name = 'change'").get() as { v: number }).v;

  const insertMember = sqlite.prepare("insert into members (id, email, name, role, password_hash, active) values (?, ?, ?, ?, ?, 1)");
  const insertClaim = sqlite.prepare("insert into claims (id, name, kind, agency_ref, boundary, rules, active, seq) values (?, ?, ?, ?, ?, '', 1, ?)");
  const insertFind = sqlite.prepare(
    "insert into finds (id, member_id, claim_id, kind, weight_grams, method, notes, lat, lon, found_at, seq) values (?, ?, ?, ?, ?, ?, '', ?, ?, ?, ?)",
  );
  const insertWeighIn = sqlite.prepare(
    "insert into weigh_ins (id, member_id, find_id, input, device_estimate, server_estimate, engine_version, fine_gold_grams, gold_alloy_grams, air_grams, weighed_at, seq) values (?, ?, ?, ?, ?, ?, ?, ?, ?, 100, ?, ?)",
  );
  const insertPrice = sqlite.prepare(
    "insert into reference_prices (id, effective_on, price_per_troy_ounce, currency, recorded_by, seq) values (?, ?, ?, 'USD', ?, ?)",
  );
  const kinds = ["nugget", "specimen", "flakes", "fines", "crystalline"];
  const methods = ["detecting", "panning", "sluicing", "drywashing"];
  sqlite.transaction(() => {
    memberIds.forEach((id, i) => insertMember.run(id, `m${i}@large.example`, `Member ${i}`, i < 5 ? "officer" : "member", passwordHash));
    claimIds.forEach((id, i) =>
      insertClaim.run(
        id,
        `Claim ${i + 1}`,
        i % 4 === 0 ? "lode" : "placer",
        `BIG-${i}`,
        JSON.stringify(claimPolygon({ lat: 40 + i * 0.01, lon: -117 - i * 0.01, halfW: 300, halfH: 150, turn: 0 })),
        ++seq,
      ),
    );
    // Invented prices drifting around 2 000 a troy ounce, one a month back from the last.
    for (let m = 0; m < size.priceMonths; m++) {
      const month = new Date(Date.UTC(2026, 10 - m, 1));
      insertPrice.run(uuidv7({ msecs: month.getTime() }), month.toISOString().slice(0, 10), Math.round(1800 + 400 * rand()), memberIds[0], ++seq);
    }
    const perFind = size.weighIns / size.finds;
    let weighed = 0;
    for (let i = 0; i < size.finds; i++) {
      const foundAt = now - Math.floor(rand() * 3 * 365) * 86_400_000;
      const findId = uuidv7({ msecs: foundAt, random: Uint8Array.from({ length: 16 }, () => Math.floor(rand() * 256)) });
      const member = memberIds[Math.floor(rand() * memberIds.length)];
      insertFind.run(
        findId,
        member,
        claimIds[i % claimIds.length],
        kinds[i % 5],
        Math.round(rand() * 5000) / 100,
        methods[i % 4],
        40 + rand(),
        -117 - rand(),
        foundAt,
        ++seq,
      );
      const target = Math.round((i + 1) * perFind);
      for (; weighed < target; weighed++) {
        const e = estimates[weighed % estimates.length];
        const json = JSON.stringify(e.estimate);
        insertWeighIn.run(
          uuidv7({ msecs: foundAt + weighed, random: Uint8Array.from({ length: 16 }, () => Math.floor(rand() * 256)) }),
          member,
          findId,
          e.input,
          json,
          json,
          e.estimate.engineVersion,
          e.estimate.fineGoldGrams,
          e.estimate.goldAlloyGrams,
          foundAt + 3_600_000 + weighed,
          ++seq,
        );
      }
    }
    sqlite.prepare("insert into sequences (name, value) values ('change', ?) on conflict(name) do update set value = excluded.value").run(seq);
    refreshAllFigures(sqlite);
  })();
  return memberIds;
}
