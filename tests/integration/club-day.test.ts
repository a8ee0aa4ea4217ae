import { v7 as uuidv7 } from "uuid";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as getLedger } from "@/app/api/club/ledger/route";
import { GET as getProduction } from "@/app/api/club/production/route";
import type { Db } from "@/server/db";
import { newFind, push } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

// Offsets from the IANA time-zone database (through Intl): Los Angeles is UTC−7 in July and
// UTC−8 in December.
const ZONE = "America/Los_Angeles";
const EVENING = Date.UTC(2026, 6, 15, 3, 30); // 20:30 on 14 July in the club's zone
const NEW_YEARS_EVE = Date.UTC(2027, 0, 1, 6, 0); // 22:00 on 31 December 2026 in the club's zone

let db: Db;
let officer: string;
const none = { params: Promise.resolve({}) };
const ledger = async (qs: string) =>
  (await (await getLedger(req(`/api/club/ledger?${qs}`, { cookie: officer }), none)).json()) as {
    rows: { id: string; foundOn: string; price: number | null }[];
    summary: { finds: number };
  };

beforeAll(async () => {
  ({ db } = await seededDatabase());
  officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
  db.$client.prepare("update club_settings set time_zone = ? where id = 1").run(ZONE);
  // A price taking effect on the evening find's own club day, in force from that day's start.
  db.$client
    .prepare("insert into reference_prices (id, effective_on, price_per_troy_ounce, currency, seq) values (?, '2026-07-14', 3000, 'USD', 999999)")
    .run(uuidv7());
});

describe("the club's own days (issue 15)", () => {
  const evening = { ...newFind(), kind: "nugget" as const, weightGrams: 3, foundAt: EVENING };
  const nye = { ...newFind(), kind: "nugget" as const, weightGrams: 2, foundAt: NEW_YEARS_EVE };

  beforeAll(async () => {
    const member = await sessionCookie(memberByEmail(db, MEMBER_EMAIL));
    const res = await push(member, uuidv7(), [
      { id: 1, name: "find.put", args: evening },
      { id: 2, name: "find.put", args: nye },
    ]);
    expect(res.body.results.map((r) => r.status)).toEqual(["applied", "applied"]);
  });

  it("an evening find is on its own day: the ledger shows it, a filter on that day finds it, the next day's does not", async () => {
    const day = await ledger("from=2026-07-14&to=2026-07-14&pageSize=200");
    expect(day.rows.map((r) => r.id)).toContain(evening.id);
    expect(day.rows.find((r) => r.id === evening.id)!.foundOn).toBe("2026-07-14");
    expect((await ledger("from=2026-07-15&to=2026-07-15&pageSize=200")).rows.map((r) => r.id)).not.toContain(evening.id);
  });

  it("a price dated that day values it", async () => {
    const day = await ledger("from=2026-07-14&to=2026-07-14&pageSize=200");
    expect(day.rows.find((r) => r.id === evening.id)!.price).toBe(3000);
  });

  it("a New Year's Eve find counts in the old season, its month December", async () => {
    expect((await ledger("season=2026&pageSize=200&sort=foundAt")).rows.map((r) => r.id)).toContain(nye.id);
    expect((await ledger("season=2027&pageSize=200")).rows.map((r) => r.id)).not.toContain(nye.id);
    const res = await getProduction(req("/api/club/production?season=2026", { cookie: officer }), none);
    const { months } = (await res.json()) as { months: { month: string; finds: number; claimId: string | null }[] };
    const december = months.filter((m) => m.month === "2026-12" && m.claimId === null);
    expect(december.reduce((n, m) => n + m.finds, 0)).toBeGreaterThanOrEqual(1);
  });
});
