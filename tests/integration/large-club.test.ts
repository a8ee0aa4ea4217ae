import { describe, expect, it } from "vitest";
import { ledgerQuerySchema } from "@/lib/club/ledger";
import { ledgerPage } from "@/server/club/ledger";
import { seedLargeClub } from "@/server/seed/large-club";
import { freshDatabase } from "../support/test-db";

// The benchmark's large club, made small: the counts asked for, a price a month, and the
// ledger figures kept on each find agreeing with the weigh-ins they come from.
describe("the large-club generator", () => {
  const { db } = freshDatabase();
  const size = { members: 12, finds: 300, weighIns: 1200, claims: 3, priceMonths: 6 };
  seedLargeClub(db, size);
  const one = <T>(q: string) => db.$client.prepare(q).get() as T;

  it("makes what it is asked for", () => {
    expect(one<{ n: number }>("select count(*) n from members").n).toBe(size.members);
    expect(one<{ n: number }>("select count(*) n from claims").n).toBe(size.claims);
    expect(one<{ n: number }>("select count(*) n from finds").n).toBe(size.finds);
    expect(one<{ n: number }>("select count(*) n from weigh_ins").n).toBe(size.weighIns);
    expect(one<{ n: number }>("select count(distinct effective_on) n from reference_prices").n).toBe(size.priceMonths);
  });

  it("keeps each find's ledger figures equal to its latest weigh-in's", () => {
    const wrong = one<{ n: number }>(`select count(*) n from finds f where f.latest_fine_grams is not
      (select w.fine_gold_grams from weigh_ins w where w.find_id = f.id order by w.weighed_at desc, w.id desc limit 1)`).n;
    expect(wrong).toBe(0);
  });

  it("gives the ledger priced totals", () => {
    const page = ledgerPage(ledgerQuerySchema.parse({ season: "2026" }));
    expect(page.summary.finds).toBeGreaterThan(0);
    expect(page.summary.value).toBeGreaterThan(0);
    expect(page.summary.currency).toBe("USD");
  });
});
