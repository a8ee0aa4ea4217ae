"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { api } from "./api";
import { PriceForm } from "./price-form";

export type PriceEntry = {
  id: string;
  effectiveOn: string;
  pricePerTroyOunce: number;
  currency: string;
  recordedBy: string | null;
  createdOn: string;
  inForce: boolean;
  withdrawn: boolean;
  note: string;
  replaces: string | null;
};

/** Every price entered, which are in force, and a withdraw or correct for each one in force. */
export function PriceHistory({ prices, currency }: { prices: PriceEntry[]; currency: string }) {
  const router = useRouter();
  const [correcting, setCorrecting] = useState<string | null>(null);
  const [status, setStatus] = useState<string | null>(null);

  async function withdraw(p: PriceEntry) {
    const note = window.prompt(`Withdraw the ${p.effectiveOn} price of ${p.pricePerTroyOunce.toFixed(2)} ${p.currency}? Say why (kept in the history):`);
    if (!note) return;
    try {
      await api(`/api/club/prices/${p.id}`, { method: "POST", body: { action: "withdraw", note } });
      setStatus("Withdrawn. Finds of its period are valued at the price before it.");
      router.refresh();
    } catch (error) {
      setStatus((error as Error).message);
    }
  }

  return (
    <section className="sheet" aria-labelledby="price-history">
      <h2 id="price-history" className="heading-bar mb-2 text-lg">
        History
      </h2>
      {status && <p role="status">{status}</p>}
      <table className="w-full text-left text-sm" data-testid="price-history">
        <thead>
          <tr className="border-b-2 border-rule">
            <th className="py-2 pr-3">In force from</th>
            <th className="py-2 pr-3 text-right">Per troy ounce</th>
            <th className="py-2 pr-3">State</th>
            <th className="py-2 pr-3">Recorded</th>
            <th className="py-2">
              <span className="sr-only">Correct or withdraw</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {prices.map((p) => (
            <tr key={p.id} className={`border-b border-rule align-top ${p.inForce ? "" : "text-ink-soft"}`} data-in-force={p.inForce}>
              <td className="figure py-2 pr-3">{p.effectiveOn}</td>
              <td className={`figure py-2 pr-3 text-right ${p.withdrawn ? "line-through" : ""}`}>
                {p.pricePerTroyOunce.toFixed(2)} {p.currency}
              </td>
              <td className="py-2 pr-3">
                {p.inForce ? "in force" : p.withdrawn ? "withdrawn" : `not in ${currency}`}
                {p.replaces ? " · a correction" : ""}
                {p.note && <span className="block text-xs">{p.note}</span>}
              </td>
              <td className="py-2 pr-3">
                {p.recordedBy ?? "—"} · <span className="figure">{p.createdOn}</span>
              </td>
              <td className="py-2">
                {p.inForce && (
                  <span className="flex gap-1">
                    <button type="button" className="btn px-2 text-sm" onClick={() => setCorrecting(correcting === p.id ? null : p.id)}>
                      Correct
                    </button>
                    <button type="button" className="btn px-2 text-sm" onClick={() => void withdraw(p)}>
                      Withdraw
                    </button>
                  </span>
                )}
                {correcting === p.id && (
                  <PriceForm currency={currency} replacing={{ id: p.id, effectiveOn: p.effectiveOn }} onDone={() => setCorrecting(null)} />
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
