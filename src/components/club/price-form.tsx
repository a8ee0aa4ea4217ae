"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { api, ApiError } from "./api";

export function PriceForm({ currency }: { currency: string }) {
  const router = useRouter();
  const [form, setForm] = useState({ effectiveOn: new Date().toISOString().slice(0, 10), price: "", currency });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [done, setDone] = useState(false);
  return (
    <form
      className="sheet flex flex-wrap items-end gap-2"
      aria-label="Record a reference price"
      onSubmit={async (e) => {
        e.preventDefault();
        setErrors({});
        setDone(false);
        try {
          await api("/api/club/prices", { method: "POST", body: { effectiveOn: form.effectiveOn, pricePerTroyOunce: Number(form.price.replace(",", ".")), currency: form.currency.toUpperCase() } });
          setDone(true);
          setForm({ ...form, price: "" });
          router.refresh();
        } catch (error) {
          if (error instanceof ApiError) setErrors(Object.fromEntries(Object.entries(error.fields).map(([k, v]) => [k, v[0]])));
        }
      }}
    >
      <label className="flex flex-col">
        <span className="field-label">In force from</span>
        <input type="date" className="field-input" value={form.effectiveOn} onChange={(e) => setForm({ ...form, effectiveOn: e.target.value })} />
        {errors.effectiveOn && <span className="field-error">{errors.effectiveOn}</span>}
      </label>
      <label className="flex flex-col">
        <span className="field-label">Price per troy ounce</span>
        <input inputMode="decimal" className="field-input figure" value={form.price} onChange={(e) => setForm({ ...form, price: e.target.value })} aria-invalid={!!errors.pricePerTroyOunce} />
        {errors.pricePerTroyOunce && <span className="field-error">{errors.pricePerTroyOunce}</span>}
      </label>
      <label className="flex flex-col">
        <span className="field-label">Currency</span>
        <input className="field-input w-24" maxLength={3} value={form.currency} onChange={(e) => setForm({ ...form, currency: e.target.value })} />
        {errors.currency && <span className="field-error">{errors.currency}</span>}
      </label>
      <button type="submit" className="btn btn-primary">
        Record the price
      </button>
      {done && (
        <span role="status" className="font-bold text-moss">
          Recorded.
        </span>
      )}
    </form>
  );
}
