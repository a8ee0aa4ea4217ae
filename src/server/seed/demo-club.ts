import "server-only";
import { count, eq } from "drizzle-orm";
import { v7 as uuidv7 } from "uuid";
import { estimateSpecimen, goldAlloyDensity, waterDensity, type SpecimenInput } from "@/lib/estimate";
import { FINENESS_PRESETS, HOST_PRESETS } from "@/lib/estimate/presets";
import { AIR_DENSITY, REFERENCE_WEIGHT_DENSITY } from "@/lib/estimate/model";
import { seededRandom } from "@/lib/estimate/uncertainty";
import type { Db } from "../db";
import * as t from "../db/schema";
import { nextSeq } from "../db/sequence";
import { refreshAllFigures } from "../club/figures";
import { DEMO_CLAIMS, DEMO_CLUB, DEMO_PASSWORDS, DEMO_PEOPLE } from "./people";

const DAY = 86_400_000;
const METRES_PER_DEG_LAT = 111_320;

/** A rectangle turned about its centre, as a closed GeoJSON ring (longitude, latitude). */
export function claimPolygon(c: { lat: number; lon: number; halfW: number; halfH: number; turn: number }): t.GeoJsonPolygon {
  const mPerDegLon = METRES_PER_DEG_LAT * Math.cos((c.lat * Math.PI) / 180);
  const corners = [
    [-1, -1],
    [1, -1],
    [1, 1],
    [-1, 1],
    [-1, -1],
  ].map(([sx, sy]) => {
    const x = sx * c.halfW;
    const y = sy * c.halfH;
    const xr = x * Math.cos(c.turn) - y * Math.sin(c.turn);
    const yr = x * Math.sin(c.turn) + y * Math.cos(c.turn);
    return [round6(c.lon + xr / mPerDegLon), round6(c.lat + yr / METRES_PER_DEG_LAT)];
  });
  return { type: "Polygon", coordinates: [corners] };
}

const round6 = (v: number) => Math.round(v * 1e6) / 1e6;
const round2 = (v: number) => Math.round(v * 100) / 100;

export type SeedResult = { seeded: boolean; members: number; finds: number; weighIns: number };

/**
 * Fills an empty database with the invented demo club. Deterministic (one seeded stream),
 * in one transaction; a database that already holds the club is left exactly as it is.
 */
export function seedDemoClub(db: Db, opts: { passwordHashes: { officer: string; member: string }; now?: number }): SeedResult {
  const already = db.select({ n: count() }).from(t.members).where(eq(t.members.email, DEMO_PEOPLE[0].email)).get();
  if (already && already.n > 0) return { seeded: false, members: 0, finds: 0, weighIns: 0 };

  const rand = seededRandom(20260401);
  const now = opts.now ?? Date.now();
  const seasonStart = now - 200 * DAY;
  const idAt = (ms: number) => uuidv7({ msecs: Math.floor(ms), random: Uint8Array.from({ length: 16 }, () => Math.floor(rand() * 256)) });
  const pick = <T>(list: readonly T[]) => list[Math.floor(rand() * list.length)];
  let finds = 0;
  let weighIns = 0;
  let nuggets = 0;

  db.transaction((tx) => {
    const memberIds = DEMO_PEOPLE.map((p) => {
      const id = idAt(seasonStart - 30 * DAY);
      tx.insert(t.members).values({ id, email: p.email, name: p.name, role: p.role, passwordHash: opts.passwordHashes[p.role], active: true }).run();
      return { id, role: p.role, email: p.email };
    });
    const officers = memberIds.filter((m) => m.role === "officer");
    tx.insert(t.clubSettings)
      .values({ id: 1, name: DEMO_CLUB, currency: "USD", timeZone: "UTC" })
      .onConflictDoUpdate({ target: t.clubSettings.id, set: { name: DEMO_CLUB } })
      .run();

    const claimRows = DEMO_CLAIMS.map((c) => {
      const id = idAt(seasonStart - 20 * DAY);
      // Each claim's gold profile, as if learned from the club's earlier melts (invented).
      const [low, high] = c.kind === "lode" ? [760, 880] : [840, 940];
      tx.insert(t.claims)
        .values({
          id,
          name: c.name,
          kind: c.kind,
          agencyRef: c.agencyRef,
          rules: c.rules,
          boundary: claimPolygon(c),
          active: true,
          seq: nextSeq(db.$client),
          fineness: (low + high) / 2,
          finenessLow: low,
          finenessHigh: high,
          finenessSource: "Demo club: two invented melts of the 2025 season",
        })
        .run();
      return { id, ...c };
    });

    [
      { daysAgo: 200, price: 2380 },
      { daysAgo: 120, price: 2455 },
      { daysAgo: 45, price: 2512 },
    ].forEach((p) => {
      const on = new Date(now - p.daysAgo * DAY).toISOString().slice(0, 10);
      tx.insert(t.referencePrices)
        .values({
          id: idAt(now - p.daysAgo * DAY),
          effectiveOn: on,
          pricePerTroyOunce: p.price,
          currency: "USD",
          recordedBy: officers[0].id,
          seq: nextSeq(db.$client),
        })
        .run();
    });

    for (const member of memberIds) {
      const outingCount = 6 + Math.floor(rand() * 5);
      for (let o = 0; o < outingCount; o++) {
        const claim = pick(claimRows);
        const start = seasonStart + Math.floor(rand() * 190) * DAY + (6 + rand() * 3) * 3_600_000;
        const hours = round2(3 + rand() * 6);
        const method = claim.kind === "lode" ? "detecting" : pick(["detecting", "panning", "sluicing", "drywashing"] as const);
        const outingId = idAt(start);
        tx.insert(t.outings)
          .values({
            id: outingId,
            memberId: member.id,
            claimId: claim.id,
            startedAt: start,
            endedAt: start + hours * 3_600_000,
            hours,
            method,
            companions: rand() < 0.4 ? "went with a club partner" : "",
            conditions: pick(["clear, hot", "overcast, breezy", "clear, cool morning", "thunderheads to the west by noon"]),
            notes: "",
            seq: nextSeq(db.$client),
          })
          .run();
        const findCount = Math.floor(rand() * 4);
        for (let f = 0; f < findCount; f++) {
          // Whole milliseconds, as a device records them (the find form keeps them when saved).
          const foundAt = Math.round(start + rand() * hours * 3_600_000);
          const kind =
            claim.kind === "lode"
              ? "specimen"
              : method === "detecting"
                ? pick(["nugget", "nugget", "specimen"] as const)
                : pick(["flakes", "fines", "nugget"] as const);
          const mPerDegLon = METRES_PER_DEG_LAT * Math.cos((claim.lat * Math.PI) / 180);
          const dx = (rand() - 0.5) * claim.halfW;
          const dy = (rand() - 0.5) * claim.halfH;
          const findId = idAt(foundAt);
          const weight = kind === "specimen" ? round2(20 + rand() * 180) : kind === "nugget" ? round2(0.3 + rand() * rand() * 12) : round2(0.05 + rand() * 1.5);
          // Now and then a member knows a nugget's purity (a buyer's acid test); no extra draw.
          const purity = kind === "nugget" && ++nuggets % 5 === 0 ? 868 : null;
          tx.insert(t.finds)
            .values({
              id: findId,
              memberId: member.id,
              outingId,
              claimId: claim.id,
              kind,
              weightGrams: weight,
              purity,
              method,
              depthCm: method === "detecting" ? Math.round(5 + rand() * 35) : null,
              notes: "",
              lat: round6(claim.lat + (dx * Math.sin(claim.turn) + dy * Math.cos(claim.turn)) / METRES_PER_DEG_LAT),
              lon: round6(claim.lon + (dx * Math.cos(claim.turn) - dy * Math.sin(claim.turn)) / mPerDegLon),
              accuracyM: round2(3 + rand() * 12),
              foundAt,
              seq: nextSeq(db.$client),
            })
            .run();
          finds++;
          if (kind === "specimen") {
            const input = specimenReadings(weight, rand);
            const estimate = estimateSpecimen(input);
            tx.insert(t.weighIns)
              .values({
                id: idAt(foundAt + DAY / 3),
                memberId: member.id,
                findId,
                input,
                deviceEstimate: estimate,
                serverEstimate: estimate,
                engineVersion: estimate.engineVersion,
                fineGoldGrams: estimate.fineGoldGrams,
                goldAlloyGrams: estimate.goldAlloyGrams,
                airGrams: input.airGrams.reduce((a, b) => a + b, 0) / input.airGrams.length,
                weighedAt: foundAt + DAY / 3,
                seq: nextSeq(db.$client),
              })
              .run();
            weighIns++;
            if (rand() < 0.35) {
              const action = rand() < 0.7 ? "verify" : "query";
              const reviewId = idAt(foundAt + 2 * DAY);
              tx.insert(t.reviews)
                .values({
                  id: reviewId,
                  findId,
                  officerId: pick(officers).id,
                  action,
                  note: action === "query" ? "Readings look close together: please weigh again with the line tared under water." : "",
                  seq: nextSeq(db.$client),
                })
                .run();
            }
          }
        }
      }
    }
    demoThread(tx, db.$client, memberIds.find((m) => m.email === DEMO_PEOPLE.find((p) => p.role === "member")!.email)!.id, officers[0].id);
    refreshAllFigures(db.$client);
  });
  return { seeded: true, members: DEMO_PEOPLE.length, finds, weighIns };
}

/**
 * A whole query thread for the member the demo signs in as: an officer queries their latest
 * unreviewed find and the member answers, so the thread shows from the first sign-in. Ids
 * take no random draws, so the rest of the demo club stays the same.
 */
function demoThread(tx: Pick<Db, "insert">, sqlite: Db["$client"], memberId: string, officerId: string) {
  const find = sqlite
    .prepare(
      "select id, found_at foundAt from finds where member_id = ? and not exists (select 1 from reviews r where r.find_id = finds.id) order by found_at desc limit 1",
    )
    .get(memberId) as { id: string; foundAt: number } | undefined;
  if (!find) return;
  const fixedId = (ms: number, fill: number) => uuidv7({ msecs: Math.floor(ms), random: new Uint8Array(16).fill(fill) });
  const reviewId = fixedId(find.foundAt + DAY, 5);
  tx.insert(t.reviews)
    .values({
      id: reviewId,
      findId: find.id,
      officerId,
      action: "query",
      note: "The weight looks high for this find: was it weighed dry, with no sand left on it?",
      seq: nextSeq(sqlite),
    })
    .run();
  tx.insert(t.answers)
    .values({
      id: fixedId(find.foundAt + 2 * DAY, 7),
      memberId,
      findId: find.id,
      reviewId,
      note: "Dried and brushed it, then weighed it again at camp: the same weight, so it stands.",
      seq: nextSeq(sqlite),
    })
    .run();
}

/**
 * Readings a 0.01 g pocket scale would give for a quartz specimen holding a little gold: three
 * repeats each, as a scale shows them in air (OIML D 28 conventional values), weighed with the
 * air-buoyancy correction on. Draws as many random numbers as it always did, so the rest of the
 * demo club stays the same.
 */
function specimenReadings(totalGrams: number, rand: () => number): SpecimenInput {
  const host = HOST_PRESETS[0];
  const natural = FINENESS_PRESETS[0];
  const fineness = 780 + Math.floor(rand() * 140);
  const hostDensity = 2.63 + rand() * 0.04;
  const gold = totalGrams * (0.01 + rand() * rand() * 0.3);
  const volume = gold / goldAlloyDensity(fineness) + (totalGrams - gold) / hostDensity;
  const waterTempC = Math.round(14 + rand() * 12);
  const conventional = 1 - AIR_DENSITY / REFERENCE_WEIGHT_DENSITY;
  const air = (totalGrams - AIR_DENSITY * volume) / conventional;
  const water = (totalGrams - waterDensity(waterTempC) * volume) / conventional;
  const wobble = rand();
  return {
    method: "hanging",
    airGrams: [round2(air), round2(air + (wobble < 0.5 ? 0 : 0.01)), round2(air)],
    waterGrams: [round2(water), round2(water + (wobble < 0.25 || wobble > 0.75 ? 0.01 : 0)), round2(water)],
    scaleResolutionGrams: 0.01,
    waterTempC,
    hostDensity: host.density,
    hostDensityRange: host.range,
    finenessPermille: natural.fineness,
    finenessRangePermille: natural.range,
    airBuoyancyCorrection: true,
  };
}

export { DEMO_PASSWORDS };
