"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { decimalMarkOf, parseNumber } from "@/lib/parse-number";
import { api, ApiError } from "./api";

type Props = {
  currency: string;
  /** When set, the form corrects this entry: the old one is withdrawn and this one recorded. */
  replacing?: { id: string; effectiveOn: string };
  onDone?: () => void;
};

/** Records a reference price, or the correction of a wrong one; asks before a jump of more than half. */
export function PriceForm({ currency, replacing, onDone }: Props) {
  const router = useRouter();
  const [form, setForm] = useState({ effectiveOn: replacing?.effectiveOn ?? new Date().toISOString().slice(0, 10), price: "", note: "" });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [jump, setJump] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);

  async function submit(confirmJump: boolean) {
    setErrors({});
    setDone(null);
    // "2,495" is two thousand four hundred ninety-five where the decimal mark is a point.
    const price = parseNumber(form.price, decimalMarkOf(navigator.language));
    if (price === undefined || Number.isNaN(price)) {
      setErrors({ pricePerTroyOunce: price === undefined ? "Enter the price per troy ounce." : "Type the price as a number, like 2495.50 (or 2,495.50)." });
      return;
    }
    const value = { effectiveOn: form.effectiveOn, pricePerTroyOunce: price, currency, note: form.note, confirmJump };
    try {
      await api(replacing ? `/api/club/prices/${replacing.id}` : "/api/club/prices", {
        method: "POST",
        body: replacing ? { action: "replace", price: value } : value,
      });
      setJump(null);
      setDone(replacing ? "Corrected: the old entry is withdrawn." : "Recorded.");
      setForm({ ...form, price: "", note: "" });
      router.refresh();
      onDone?.();
    } catch (error) {
      if (!(error instanceof ApiError)) throw error;
      if (error.status === 409 && error.fields.pricePerTroyOunce) {
        setJump(error.message);
        return;
      }
      setErrors(Object.fromEntries(Object.entries(error.fields).map(([k, v]) => [k, v[0]])));
      if (Object.keys(error.fields).length === 0) setErrors({ _: error.message });
    }
  }

  return (
    <form
      className="sheet flex flex-wrap items-end gap-2"
      aria-label={replacing ? "Correct this price" : "Record a reference price"}
      onSubmit={(e) => {
        e.preventDefault();
        void submit(false);
      }}
    >
      <label className="flex flex-col">
        <span className="field-label">In force from</span>
        <input
          type="date"
          className="field-input"
          value={form.effectiveOn}
          onChange={(e) => setForm({ ...form, effectiveOn: e.target.value })}
          aria-invalid={!!errors.effectiveOn}
        />
        {errors.effectiveOn && <span className="field-error">{errors.effectiveOn}</span>}
      </label>
      <label className="flex flex-col">
        <span className="field-label">Price per troy ounce ({currency})</span>
        <input
          inputMode="decimal"
          className="field-input figure"
          value={form.price}
          onChange={(e) => setForm({ ...form, price: e.target.value })}
          aria-invalid={!!errors.pricePerTroyOunce}
        />
        {errors.pricePerTroyOunce && <span className="field-error">{errors.pricePerTroyOunce}</span>}
      </label>
      <label className="flex flex-col">
        <span className="field-label">Note (where the price comes from)</span>
        <input className="field-input" value={form.note} onChange={(e) => setForm({ ...form, note: e.target.value })} aria-invalid={!!errors.note} />
        {errors.note && <span className="field-error">{errors.note}</span>}
      </label>
      <button type="submit" className="btn btn-primary">
        {replacing ? "Record the correction" : "Record the price"}
      </button>
      {jump && (
        <div role="alert" className="w-full rounded-md border-2 border-rust p-2">
          <p>{jump}</p>
          <button type="button" className="btn mt-2" onClick={() => void submit(true)}>
            It is right: record it
          </button>
        </div>
      )}
      {errors._ && <p className="field-error w-full">{errors._}</p>}
      {done && (
        <span role="status" className="font-bold text-moss">
          {done}
        </span>
      )}
    </form>
  );
}
