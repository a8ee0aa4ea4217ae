"use client";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { api, ApiError } from "./api";

type Settings = { name: string; currency: string; timeZone: string };

/** The club's name (it heads reports), its one currency, and the time zone of its days. */
export function ClubSettingsForm({ settings }: { settings: Settings }) {
  const router = useRouter();
  const [form, setForm] = useState(settings);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<string | null>(null);
  const zones = useMemo(() => Intl.supportedValuesOf("timeZone"), []);

  async function save() {
    setErrors({});
    try {
      await api("/api/club/settings", { method: "PUT", body: { ...form, currency: form.currency.toUpperCase() } });
      setStatus("Saved.");
      router.refresh();
    } catch (error) {
      if (error instanceof ApiError) setErrors(Object.fromEntries(Object.entries(error.fields).map(([k, v]) => [k, v[0]])));
      setStatus((error as Error).message);
    }
  }

  return (
    <form className="sheet grid gap-3 md:grid-cols-3" aria-label="The club" onSubmit={(e) => (e.preventDefault(), void save())}>
      <label className="flex flex-col">
        <span className="field-label">Club name</span>
        <input className="field-input" value={form.name} onChange={(e) => setForm({ ...form, name: e.target.value })} aria-invalid={!!errors.name} />
        {errors.name && <span className="field-error">{errors.name}</span>}
      </label>
      <label className="flex flex-col">
        <span className="field-label">Currency</span>
        <input
          className="field-input w-24"
          maxLength={3}
          value={form.currency}
          onChange={(e) => setForm({ ...form, currency: e.target.value })}
          aria-invalid={!!errors.currency}
        />
        {errors.currency && <span className="field-error">{errors.currency}</span>}
      </label>
      <label className="flex flex-col">
        <span className="field-label">Time zone (the club&apos;s days)</span>
        <select className="field-input" value={form.timeZone} onChange={(e) => setForm({ ...form, timeZone: e.target.value })} aria-invalid={!!errors.timeZone}>
          {[...new Set(["UTC", ...zones])].map((z) => (
            <option key={z} value={z}>
              {z}
            </option>
          ))}
        </select>
        {errors.timeZone && <span className="field-error">{errors.timeZone}</span>}
      </label>
      <div className="flex items-center gap-3 md:col-span-3">
        <button type="submit" className="btn btn-primary">
          Save the club&apos;s settings
        </button>
        {status && <span role="status">{status}</span>}
      </div>
    </form>
  );
}
