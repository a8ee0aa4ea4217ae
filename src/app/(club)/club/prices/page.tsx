import type { Metadata } from "next";
import { ClubSettingsForm } from "@/components/club/club-settings-form";
import { PriceForm } from "@/components/club/price-form";
import { PriceHistory } from "@/components/club/price-history";
import { formatDay } from "@/lib/format";
import { requirePageActor } from "@/server/auth/current";
import { listPrices } from "@/server/club/prices";
import { clubSettings } from "@/server/club/settings";

export const metadata: Metadata = { title: "Club and reference price" };

export default async function PricesPage() {
  await requirePageActor("managePrices", "/club/prices");
  const settings = clubSettings();
  const prices = listPrices().map((p) => ({
    id: p.id,
    effectiveOn: p.effectiveOn,
    pricePerTroyOunce: p.pricePerTroyOunce,
    currency: p.currency,
    recordedBy: p.recordedBy,
    createdOn: formatDay(p.createdAt, settings.timeZone),
    inForce: p.inForce,
    withdrawn: p.withdrawnAt !== null,
    note: p.note,
    replaces: p.replaces,
  }));
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Club and reference price</h1>
      <ClubSettingsForm settings={settings} />
      <p className="text-ink-soft">
        The club&apos;s own price for valuing estimated fine gold in the ledger and reports, in {settings.currency}. Not a quote: buyers pay their own prices. A
        wrong entry is corrected or withdrawn, never erased.
      </p>
      <PriceForm currency={settings.currency} />
      <PriceHistory prices={prices} currency={settings.currency} />
    </div>
  );
}
