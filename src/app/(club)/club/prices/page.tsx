import type { Metadata } from "next";
import { PriceForm } from "@/components/club/price-form";
import { formatDay } from "@/lib/format";
import { requirePageActor } from "@/server/auth/current";
import { listPrices } from "@/server/club/prices";

export const metadata: Metadata = { title: "Reference price" };

export default async function PricesPage() {
  await requirePageActor("managePrices", "/club/prices");
  const prices = listPrices();
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Reference gold price</h1>
      <p className="text-ink-soft">The club&apos;s own price for valuing estimated fine gold in the ledger and reports. Not a quote: buyers pay their own prices.</p>
      <PriceForm currency={prices[0]?.currency ?? "USD"} />
      <section className="sheet">
        <h2 className="heading-bar mb-2 text-lg">History</h2>
        <table className="w-full text-left text-sm">
          <thead>
            <tr className="border-b-2 border-rule">
              <th className="py-2 pr-3">In force from</th>
              <th className="py-2 pr-3 text-right">Per troy ounce</th>
              <th className="py-2 pr-3">Recorded by</th>
              <th className="py-2">On</th>
            </tr>
          </thead>
          <tbody>
            {prices.map((p) => (
              <tr key={p.id} className="border-b border-rule">
                <td className="figure py-2 pr-3">{p.effectiveOn}</td>
                <td className="figure py-2 pr-3 text-right">
                  {p.pricePerTroyOunce.toFixed(2)} {p.currency}
                </td>
                <td className="py-2 pr-3">{p.recordedBy ?? "—"}</td>
                <td className="figure py-2">{formatDay(p.createdAt)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
