"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { parseNumber } from "@/lib/parse-number";
import { api, ApiError } from "./api";

export type ClaimProfile = {
  id: string;
  name: string;
  fineness: number;
  finenessLow: number;
  finenessHigh: number;
  finenessSource: string;
  hostDensity: number;
  hostDensityLow: number;
  hostDensityHigh: number;
  hostDensitySource: string;
};

type Field = "finenessLow" | "finenessHigh" | "finenessSource" | "hostDensityLow" | "hostDensityHigh" | "hostDensitySource";

/**
 * The claim gold profile: the fineness of its gold and the density of its host rock, each as a
 * range (its middle is the value used) with where it came from. Saving changes later figures;
 * re-figuring a season applies it to that season's finds too (audited).
 */
export function ClaimProfileEditor({ claim, season }: { claim: ClaimProfile; season: number }) {
  const router = useRouter();
  const [form, setForm] = useState<Record<Field, string>>({
    finenessLow: String(claim.finenessLow),
    finenessHigh: String(claim.finenessHigh),
    finenessSource: claim.finenessSource,
    hostDensityLow: String(claim.hostDensityLow),
    hostDensityHigh: String(claim.hostDensityHigh),
    hostDensitySource: claim.hostDensitySource,
  });
  const [errors, setErrors] = useState<Partial<Record<Field, string>>>({});
  const [status, setStatus] = useState<string | null>(null);

  const numbers = () => {
    const out: Record<string, number | string> = {};
    const problems: Partial<Record<Field, string>> = {};
    for (const k of ["finenessLow", "finenessHigh", "hostDensityLow", "hostDensityHigh"] as const) {
      const n = parseNumber(form[k]);
      if (n === undefined || Number.isNaN(n)) problems[k] = "Type a number.";
      else out[k] = n;
    }
    out.finenessSource = form.finenessSource;
    out.hostDensitySource = form.hostDensitySource;
    return { body: out, problems };
  };

  async function save() {
    const { body, problems } = numbers();
    setErrors(problems);
    if (Object.keys(problems).length) return setStatus("Check the marked fields.");
    try {
      await api(`/api/club/claims/${claim.id}/profile`, { method: "PUT", body });
      setStatus("Saved. New figures on this claim use it; members' weigh-ins start from it after their next sync.");
      router.refresh();
    } catch (error) {
      if (error instanceof ApiError) setErrors(Object.fromEntries(Object.entries(error.fields).map(([k, v]) => [k, v[0]])) as Partial<Record<Field, string>>);
      setStatus(error instanceof Error ? error.message : String(error));
    }
  }

  async function refigure() {
    if (
      !window.confirm(
        `Re-figure every ${season} find on ${claim.name} with ${claim.finenessLow}–${claim.finenessHigh} ‰? Their fine-gold figures change, and the change is logged.`,
      )
    )
      return;
    try {
      const { finds } = await api<{ finds: number }>(`/api/club/claims/${claim.id}/refigure`, { method: "POST", body: { season } });
      setStatus(`${finds} find${finds === 1 ? "" : "s"} of ${season} re-figured.`);
      router.refresh();
    } catch (error) {
      setStatus(error instanceof Error ? error.message : String(error));
    }
  }

  const input = (k: Field, label: string, wide = false) => (
    <label className={`flex flex-col ${wide ? "md:col-span-2" : ""}`}>
      <span className="field-label">{label}</span>
      <input
        className={`field-input ${wide ? "" : "figure"}`}
        inputMode={wide ? undefined : "decimal"}
        value={form[k]}
        onChange={(e) => setForm({ ...form, [k]: e.target.value })}
        aria-invalid={!!errors[k]}
      />
      {errors[k] && <span className="field-error">{errors[k]}</span>}
    </label>
  );

  return (
    <form className="sheet grid gap-3 md:grid-cols-4" aria-label={`Gold profile of ${claim.name}`} onSubmit={(e) => (e.preventDefault(), void save())}>
      <p className="md:col-span-4">
        Fineness in use: <span className="figure font-bold">{claim.fineness} ‰</span> ({claim.finenessLow}–{claim.finenessHigh}) · host rock{" "}
        <span className="figure font-bold">{claim.hostDensity} g/cm³</span> ({claim.hostDensityLow}–{claim.hostDensityHigh})
      </p>
      {input("finenessLow", "Fineness, lowest (‰)")}
      {input("finenessHigh", "Fineness, highest (‰)")}
      {input("finenessSource", "Where the fineness comes from", true)}
      {input("hostDensityLow", "Host rock, lowest (g/cm³)")}
      {input("hostDensityHigh", "Host rock, highest (g/cm³)")}
      {input("hostDensitySource", "Where the host density comes from", true)}
      <div className="flex flex-wrap items-center gap-3 md:col-span-4">
        <button type="submit" className="btn btn-primary">
          Save the gold profile
        </button>
        <button type="button" className="btn" onClick={() => void refigure()}>
          Re-figure the {season} season with it
        </button>
        {status && <span role="status">{status}</span>}
      </div>
      <p className="text-xs text-ink-soft md:col-span-4">
        The value used is the middle of each range. Fineness learned from the club&apos;s own melts and assays beats a preset; an estimate is still not an
        assay.
      </p>
    </form>
  );
}
