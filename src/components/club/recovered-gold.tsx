"use client";
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useDropzone } from "react-dropzone";
import type { LedgerPage } from "@/lib/club/ledger";
import { KIND_LABELS } from "@/lib/entities/constants";
import type { FinenessProposal } from "@/lib/figures/proposal";
import { MIN_HALF_RANGE } from "@/lib/figures/proposal";
import { formatGrams } from "@/lib/format";
import { decimalMarkOf, parseNumber } from "@/lib/parse-number";
import { api, ApiError } from "./api";
import type { ClaimProfile } from "./claim-profile-editor";

type Recovery = {
  id: string;
  kind: "melt" | "assay";
  recordedOn: string;
  fineGrams: number;
  fineness: number | null;
  estimatedGrams: number;
  finds: number;
  hasDocument: boolean;
  documentName: string | null;
  note: string;
};
type Answer = { recoveries: Recovery[]; comparison: { ratios: number[]; mean: number | null; sd: number | null }; proposal: FinenessProposal | null };

/**
 * A claim's melts and assays for the season: what was recovered against what was estimated,
 * the fineness they propose (put into the claim's gold profile with one press), and a form to
 * record a melt of chosen finds or an assay of one, with its document.
 */
export function RecoveredGold({ claim, season }: { claim: ClaimProfile; season: number }) {
  const router = useRouter();
  const client = useQueryClient();
  const key = ["recoveries", claim.id, season];
  const { data } = useQuery({ queryKey: key, queryFn: () => api<Answer>(`/api/club/recoveries?claimId=${claim.id}&season=${season}`) });
  const candidates = useQuery({
    queryKey: ["melt-candidates", claim.id, season],
    queryFn: () => api<LedgerPage>(`/api/club/ledger?claimId=${claim.id}&season=${season}&pageSize=200&sort=foundAt&dir=asc`),
  });
  const [form, setForm] = useState({ kind: "melt" as "melt" | "assay", recordedOn: new Date().toISOString().slice(0, 10), fine: "", fineness: "", note: "" });
  const [chosen, setChosen] = useState<Set<string>>(new Set());
  const [document, setDocument] = useState<File | null>(null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<string | null>(null);
  const { getRootProps, getInputProps } = useDropzone({
    accept: { "application/pdf": [".pdf"], "image/jpeg": [".jpg", ".jpeg"], "image/png": [".png"] },
    maxFiles: 1,
    maxSize: 4 * 1024 * 1024,
    onDrop: (files) => (files[0] ? setDocument(files[0]) : setErrors({ document: "A PDF, JPEG or PNG of at most 4 MB." })),
  });
  const open = (candidates.data?.rows ?? []).filter((r) => r.fineBasis !== "assay");

  async function record() {
    setErrors({});
    const mark = decimalMarkOf(navigator.language);
    const fine = parseNumber(form.fine, mark);
    const fineness = parseNumber(form.fineness, mark);
    if (fine === undefined || Number.isNaN(fine)) return setErrors({ fineGrams: "Type the fine gold recovered, in grams." });
    if (fineness !== undefined && Number.isNaN(fineness)) return setErrors({ fineness: "Type the fineness in ‰, or leave it empty for a melt." });
    try {
      const { id } = await api<{ id: string }>("/api/club/recoveries", {
        method: "POST",
        body: {
          kind: form.kind,
          claimId: claim.id,
          recordedOn: form.recordedOn,
          fineGrams: fine,
          fineness: fineness ?? null,
          findIds: [...chosen],
          note: form.note,
        },
      });
      if (document) {
        const res = await fetch(`/api/club/recoveries/${id}/document`, {
          method: "PUT",
          body: document,
          headers: { "x-file-name": document.name },
          credentials: "same-origin",
        });
        if (!res.ok)
          setErrors({ document: ((await res.json().catch(() => ({}))) as { error?: { message?: string } }).error?.message ?? "The document was not kept." });
      }
      setStatus(`Recorded: ${chosen.size} find${chosen.size === 1 ? "" : "s"} now figured from it.`);
      setChosen(new Set());
      setDocument(null);
      setForm({ ...form, fine: "", fineness: "", note: "" });
      await client.invalidateQueries({ queryKey: key });
      await client.invalidateQueries({ queryKey: ["melt-candidates", claim.id, season] });
    } catch (error) {
      if (error instanceof ApiError) setErrors(Object.fromEntries(Object.entries(error.fields).map(([k, v]) => [k, v[0]])));
      setStatus((error as Error).message);
    }
  }

  async function accept(p: FinenessProposal) {
    try {
      await api(`/api/club/claims/${claim.id}/profile`, {
        method: "PUT",
        body: {
          finenessLow: p.low,
          finenessHigh: p.high,
          finenessSource: `Proposed from ${p.recoveries} melt${p.recoveries === 1 ? "" : "s"} and assays of ${season} (${formatGrams(p.weightGrams)} of gold)`,
          hostDensityLow: claim.hostDensityLow,
          hostDensityHigh: claim.hostDensityHigh,
          hostDensitySource: claim.hostDensitySource,
        },
      });
      setStatus("The claim's fineness is now the proposal. Re-figure the season if earlier finds should use it too.");
      router.refresh();
    } catch (error) {
      setStatus((error as Error).message);
    }
  }

  const c = data?.comparison;
  return (
    <section className="sheet flex flex-col gap-3" aria-label={`Recovered gold on ${claim.name}`}>
      <h3 className="text-lg font-bold">Recovered gold, {season}</h3>
      {data && data.recoveries.length === 0 && <p className="text-ink-soft">No melt or assay recorded this season.</p>}
      {data && data.recoveries.length > 0 && (
        <table className="w-full text-left text-sm" data-testid="recoveries">
          <thead>
            <tr className="border-b-2 border-rule">
              <th className="py-1 pr-2">Day</th>
              <th className="py-1 pr-2">What</th>
              <th className="py-1 pr-2 text-right">Estimated</th>
              <th className="py-1 pr-2 text-right">Recovered</th>
              <th className="py-1 pr-2 text-right">Ratio</th>
              <th className="py-1">Document</th>
            </tr>
          </thead>
          <tbody>
            {data.recoveries.map((r) => (
              <tr key={r.id} className="border-b border-rule">
                <td className="figure py-1 pr-2">{r.recordedOn}</td>
                <td className="py-1 pr-2">
                  {r.kind === "melt" ? `Melt of ${r.finds} find${r.finds === 1 ? "" : "s"}` : "Assay"}
                  {r.fineness !== null ? ` · ${r.fineness} ‰` : ""}
                </td>
                <td className="figure py-1 pr-2 text-right">{formatGrams(r.estimatedGrams)}</td>
                <td className="figure py-1 pr-2 text-right">{formatGrams(r.fineGrams)}</td>
                <td className="figure py-1 pr-2 text-right">{r.estimatedGrams > 0 ? (r.fineGrams / r.estimatedGrams).toFixed(2) : "—"}</td>
                <td className="py-1">
                  {r.hasDocument ? (
                    <a className="underline" href={`/api/club/recoveries/${r.id}/document`}>
                      {r.documentName ?? "document"}
                    </a>
                  ) : (
                    "—"
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {c?.mean != null && (
        <p className="text-sm" data-testid="recovery-ratio">
          Recovered ÷ estimated: <span className="figure font-bold">{c.mean.toFixed(2)}</span>
          {c.sd != null ? (
            <span className="figure">
              {" "}
              ± {c.sd.toFixed(2)} over {c.ratios.length}
            </span>
          ) : (
            " (one so far)"
          )}
          .
        </p>
      )}
      {data?.proposal && (
        <div className="rounded-md border-2 border-rule p-2" data-testid="fineness-proposal">
          <p>
            The club&apos;s own recoveries say this claim&apos;s gold is{" "}
            <span className="figure font-bold">
              {data.proposal.value} ‰ ({data.proposal.low}–{data.proposal.high})
            </span>
            , from {data.proposal.recoveries} melt{data.proposal.recoveries === 1 ? "" : "s"} or assays. The profile now says {claim.fineness} ‰ (
            {claim.finenessLow}–{claim.finenessHigh}).
          </p>
          <button type="button" className="btn mt-2" onClick={() => void accept(data.proposal!)}>
            Use the proposed fineness
          </button>
          <p className="mt-1 text-xs text-ink-soft">
            Weighted mean of each recovery&apos;s fineness, ± twice their spread, at least ± {MIN_HALF_RANGE} ‰ (see the README).
          </p>
        </div>
      )}

      <form className="grid gap-2 md:grid-cols-4" aria-label={`Record a melt or assay on ${claim.name}`} onSubmit={(e) => (e.preventDefault(), void record())}>
        <label className="flex flex-col">
          <span className="field-label">What</span>
          <select className="field-input" value={form.kind} onChange={(e) => setForm({ ...form, kind: e.target.value as "melt" | "assay" })}>
            <option value="melt">Melt of several finds</option>
            <option value="assay">Assay of one find</option>
          </select>
        </label>
        <label className="flex flex-col">
          <span className="field-label">Day</span>
          <input
            type="date"
            className="field-input"
            value={form.recordedOn}
            onChange={(e) => setForm({ ...form, recordedOn: e.target.value })}
            aria-invalid={!!errors.recordedOn}
          />
          {errors.recordedOn && <span className="field-error">{errors.recordedOn}</span>}
        </label>
        <label className="flex flex-col">
          <span className="field-label">Fine gold recovered (g)</span>
          <input
            inputMode="decimal"
            className="field-input figure"
            value={form.fine}
            onChange={(e) => setForm({ ...form, fine: e.target.value })}
            aria-invalid={!!errors.fineGrams}
          />
          {errors.fineGrams && <span className="field-error">{errors.fineGrams}</span>}
        </label>
        <label className="flex flex-col">
          <span className="field-label">Fineness (‰){form.kind === "melt" ? ", if assayed" : ""}</span>
          <input
            inputMode="decimal"
            className="field-input figure"
            value={form.fineness}
            onChange={(e) => setForm({ ...form, fineness: e.target.value })}
            aria-invalid={!!errors.fineness}
          />
          {errors.fineness && <span className="field-error">{errors.fineness}</span>}
        </label>
        <fieldset className="md:col-span-4">
          <legend className="field-label">Finds that went in ({chosen.size} chosen)</legend>
          {errors.findIds && <p className="field-error">{errors.findIds}</p>}
          <div className="max-h-48 overflow-y-auto rounded-md border border-rule p-1 text-sm">
            {open.length === 0 && <p className="text-ink-soft">No finds of {season} on this claim are waiting for a melt or assay.</p>}
            {open.map((r) => (
              <label key={r.id} className="flex min-h-touch items-center gap-2">
                <input
                  type="checkbox"
                  className="h-5 w-5"
                  checked={chosen.has(r.id)}
                  onChange={(e) => {
                    const next = new Set(chosen);
                    if (e.target.checked) next.add(r.id);
                    else next.delete(r.id);
                    setChosen(next);
                  }}
                />
                <span className="figure">{r.foundOn}</span> · {r.memberName} · {KIND_LABELS[r.kind as keyof typeof KIND_LABELS]} ·{" "}
                {r.weightGrams != null ? formatGrams(r.weightGrams) : "no weight"}
              </label>
            ))}
          </div>
        </fieldset>
        <div className="md:col-span-2">
          <div {...getRootProps({ className: "rounded-md border-2 border-dashed border-ink-soft p-3 text-center text-sm" })}>
            <input {...getInputProps({ "aria-label": "The melt's or assay's document" })} />
            {document ? `Document: ${document.name}` : "Drop the assay report or the melt slip (PDF or photo), or click to choose"}
          </div>
          {errors.document && <span className="field-error">{errors.document}</span>}
        </div>
        <label className="flex flex-col md:col-span-2">
          <span className="field-label">Note</span>
          <input className="field-input" value={form.note} onChange={(e) => setForm({ ...form, note: e.target.value })} />
        </label>
        <div className="flex items-center gap-3 md:col-span-4">
          <button type="submit" className="btn btn-primary">
            Record it
          </button>
          {status && <span role="status">{status}</span>}
        </div>
      </form>
    </section>
  );
}
