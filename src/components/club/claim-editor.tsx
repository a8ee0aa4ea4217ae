"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useDropzone } from "react-dropzone";
import { MAX_CLAIM_FILE_BYTES, MAX_CLAIM_POSITIONS, readBoundary } from "@/lib/club/geometry";
import { decimalMarkOf, parseNumber } from "@/lib/parse-number";
import type { Polygon } from "@/lib/entities/claim";
import { api, ApiError } from "./api";

export type EditableClaim = {
  id: string;
  name: string;
  kind: "placer" | "lode";
  agencyRef: string | null;
  rules: string;
  active: boolean;
  boundary: Polygon | null;
  landowner: string | null;
  royaltyKind: "percent_of_value" | "grams_per_troy_ounce" | null;
  royaltyRate: number | null;
};

/** Create or edit a claim: details, and a boundary from a GeoJSON file or typed corners. */
export function ClaimEditor({ claim }: { claim?: EditableClaim }) {
  const router = useRouter();
  const [form, setForm] = useState({
    name: claim?.name ?? "",
    kind: claim?.kind ?? "placer",
    agencyRef: claim?.agencyRef ?? "",
    rules: claim?.rules ?? "",
    active: claim?.active ?? true,
    corners: "",
    landowner: claim?.landowner ?? "",
    royaltyKind: claim?.royaltyKind ?? "",
    royaltyRate: claim?.royaltyRate == null ? "" : String(claim.royaltyRate),
  });
  const [boundary, setBoundary] = useState<Polygon | null | undefined>(undefined);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<string | null>(null);
  const [overlap, setOverlap] = useState<string | null>(null);

  const { getRootProps, getInputProps } = useDropzone({
    accept: { "application/geo+json": [".geojson", ".json"], "application/json": [".json"] },
    maxFiles: 1,
    maxSize: MAX_CLAIM_FILE_BYTES,
    onDrop: async (files) => {
      const file = files[0];
      if (!file)
        return setErrors({ boundary: `Drop one .geojson file of at most ${MAX_CLAIM_FILE_BYTES / 1_000_000} MB and ${MAX_CLAIM_POSITIONS} positions.` });
      let parsed: unknown;
      try {
        parsed = JSON.parse(await file.text());
      } catch {
        return setErrors({ boundary: "That file is not JSON." });
      }
      const r = readBoundary(parsed);
      if (!r.ok) return setErrors({ boundary: r.message });
      setErrors({});
      setBoundary(r.polygon);
      setStatus(`Boundary read from ${file.name}: ${r.polygon.type === "Polygon" ? r.polygon.coordinates[0].length - 1 : "several"} corners.`);
    },
  });

  async function save(acceptOverlap = false) {
    setErrors({});
    setOverlap(null);
    try {
      const body = {
        name: form.name,
        kind: form.kind,
        agencyRef: form.agencyRef || null,
        rules: form.rules,
        active: form.active,
        acceptOverlap,
        landowner: form.landowner.trim() || null,
        royaltyKind: form.royaltyKind || null,
        royaltyRate: form.royaltyRate.trim() === "" ? null : (parseNumber(form.royaltyRate, decimalMarkOf(navigator.language)) ?? null),
        ...(boundary !== undefined ? { boundary } : {}),
        ...(form.corners.trim() ? { corners: form.corners } : {}),
      };
      await api(claim ? `/api/club/claims/${claim.id}` : "/api/club/claims", { method: claim ? "PUT" : "POST", body });
      setStatus("Saved. Members' devices get it at their next sync.");
      router.refresh();
    } catch (error) {
      // What was typed stays in the form; only the messages change.
      if (error instanceof ApiError && error.status === 409 && error.fields.boundary) return setOverlap(error.message);
      if (error instanceof ApiError) setErrors(Object.fromEntries(Object.entries(error.fields).map(([k, v]) => [k, v[0]])));
      setStatus(error instanceof Error ? error.message : String(error));
    }
  }

  const text = (key: "name" | "agencyRef", label: string) => (
    <label className="flex flex-col">
      <span className="field-label">{label}</span>
      <input className="field-input" value={form[key]} onChange={(e) => setForm({ ...form, [key]: e.target.value })} aria-invalid={!!errors[key]} />
      {errors[key] && <span className="field-error">{errors[key]}</span>}
    </label>
  );

  return (
    <form
      className="sheet grid gap-3 md:grid-cols-2"
      onSubmit={(e) => (e.preventDefault(), void save())}
      aria-label={claim ? `Edit ${claim.name}` : "New claim"}
    >
      {text("name", "Name")}
      {text("agencyRef", "Agency reference (serial number)")}
      <label className="flex flex-col">
        <span className="field-label">Kind</span>
        <select className="field-input" value={form.kind} onChange={(e) => setForm({ ...form, kind: e.target.value as "placer" | "lode" })}>
          <option value="placer">Placer</option>
          <option value="lode">Lode</option>
        </select>
      </label>
      <label className="flex min-h-touch items-center gap-2">
        <input type="checkbox" className="h-5 w-5" checked={form.active} onChange={(e) => setForm({ ...form, active: e.target.checked })} />
        Active (offered for new finds; a retired claim is kept for its history)
      </label>
      <label className="flex flex-col">
        <span className="field-label">Landowner (for the landowner&apos;s statement)</span>
        <input
          className="field-input"
          value={form.landowner}
          onChange={(e) => setForm({ ...form, landowner: e.target.value })}
          aria-invalid={!!errors.landowner}
        />
        {errors.landowner && <span className="field-error">{errors.landowner}</span>}
      </label>
      <div className="grid grid-cols-2 gap-2">
        <label className="flex flex-col">
          <span className="field-label">Royalty</span>
          <select
            className="field-input"
            value={form.royaltyKind}
            onChange={(e) => setForm({ ...form, royaltyKind: e.target.value as typeof form.royaltyKind })}
          >
            <option value="">None</option>
            <option value="percent_of_value">% of the value</option>
            <option value="grams_per_troy_ounce">g per troy ounce</option>
          </select>
        </label>
        <label className="flex flex-col">
          <span className="field-label">Rate</span>
          <input
            inputMode="decimal"
            className="field-input figure"
            value={form.royaltyRate}
            onChange={(e) => setForm({ ...form, royaltyRate: e.target.value })}
            aria-invalid={!!errors.royaltyRate}
          />
          {errors.royaltyRate && <span className="field-error">{errors.royaltyRate}</span>}
        </label>
      </div>
      <label className="flex flex-col md:col-span-2">
        <span className="field-label">Rules for members</span>
        <textarea rows={3} className="field-input" value={form.rules} onChange={(e) => setForm({ ...form, rules: e.target.value })} />
      </label>
      <div className="flex flex-col gap-2">
        <span className="field-label">Boundary from a GeoJSON file</span>
        <div {...getRootProps({ className: "rounded-md border-2 border-dashed border-edge p-4 text-center" })}>
          <input {...getInputProps({ "aria-label": "GeoJSON boundary file" })} />
          Drop a .geojson file here, or click to choose
        </div>
        {errors.boundary && <span className="field-error">{errors.boundary}</span>}
      </div>
      <label className="flex flex-col">
        <span className="field-label">…or corners, one per line (latitude, longitude)</span>
        <textarea
          rows={4}
          className="field-input figure"
          value={form.corners}
          onChange={(e) => setForm({ ...form, corners: e.target.value })}
          placeholder={"41.8012, -117.6231\n41.8012, -117.6175"}
          aria-invalid={!!errors.corners}
        />
        {errors.corners && <span className="field-error">{errors.corners}</span>}
      </label>
      <div className="flex items-center gap-3 md:col-span-2">
        <button type="submit" className="btn btn-primary">
          {claim ? "Save the claim" : "Add the claim"}
        </button>
        {status && <span role="status">{status}</span>}
      </div>
      {overlap && (
        <div role="alert" className="rounded-md border-2 border-rust p-2 md:col-span-2">
          <p>{overlap}</p>
          <button type="button" className="btn mt-2" onClick={() => void save(true)}>
            The overlap is right: save it
          </button>
        </div>
      )}
      <p className="text-xs text-ink-soft md:col-span-2">
        A boundary drawn here is the club&apos;s working outline, not a survey. The land agency&apos;s records decide.
      </p>
    </form>
  );
}
