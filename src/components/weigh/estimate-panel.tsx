"use client";
import { useState } from "react";
import { goldAlloyDensity } from "@/lib/estimate/alloy";
import type { SpecimenEstimate, SpecimenInput } from "@/lib/estimate/types";
import { convertMass, gramsToTroyOunces, MASS_UNIT_LABELS, MASS_UNITS, type MassUnit } from "@/lib/estimate/units";
import { DensityPicture } from "./density-picture";
import { parseNumber } from "./form-model";

const DIGITS: Record<MassUnit, number> = { g: 3, ozt: 4, dwt: 3, gr: 1 };

type Props = { estimate: SpecimenEstimate; input: SpecimenInput; unit: MassUnit; onUnitChange: (u: MassUnit) => void };

export function EstimatePanel({ estimate, input, unit, onUnitChange }: Props) {
  const [price, setPrice] = useState("");
  const [currency, setCurrency] = useState("USD");
  const fmt = (g: number) => `${convertMass(g, unit).toFixed(DIGITS[unit])} ${unit}`;
  const airMean = input.airGrams.reduce((a, b) => a + b, 0) / input.airGrams.length;
  const alloyDensity = input.goldDensity ?? goldAlloyDensity(input.finenessPermille ?? 1000);
  const perOz = parseNumber(price);
  const value = (g: number) => (perOz && perOz > 0 ? `${(gramsToTroyOunces(g) * perOz).toFixed(2)} ${currency}` : "—");
  const [fLo, fHi] = estimate.range.fineGoldGrams;
  const [aLo, aHi] = estimate.range.goldAlloyGrams;

  return (
    <section aria-labelledby="estimate-title" aria-live="polite" className="sheet flex flex-col gap-3" data-testid="estimate">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="estimate-title" className="heading-bar text-lg">
          Estimate
        </h2>
        <label className="flex items-center gap-2 text-sm font-bold">
          Show in
          <select className="field-input w-auto" value={unit} onChange={(e) => onUnitChange(e.target.value as MassUnit)}>
            {MASS_UNITS.map((u) => (
              <option key={u} value={u}>
                {MASS_UNIT_LABELS[u]}
              </option>
            ))}
          </select>
        </label>
      </div>

      <div>
        <p className="text-sm text-ink-soft">Fine gold</p>
        <p className="figure text-3xl font-bold" data-testid="fine-gold">
          {fmt(estimate.fineGoldGrams)}
        </p>
        <p className="figure" data-testid="fine-range">
          range {fmt(fLo)} – {fmt(fHi)} · ± {fmt(estimate.standardUncertainty.fineGoldGrams)} (1 s.u.)
        </p>
      </div>

      <dl className="grid grid-cols-2 gap-x-4 gap-y-2 text-sm">
        <div>
          <dt className="text-ink-soft">Gold alloy</dt>
          <dd className="figure font-bold" data-testid="alloy-gold">
            {fmt(estimate.goldAlloyGrams)}
          </dd>
          <dd className="figure text-ink-soft">
            {fmt(aLo)} – {fmt(aHi)}
          </dd>
        </div>
        <div>
          <dt className="text-ink-soft">Gold by weight</dt>
          <dd className="figure font-bold">{estimate.goldMassPercent.toFixed(1)} %</dd>
          <dd className="figure text-ink-soft">{estimate.goldVolumePercent.toFixed(1)} % by volume</dd>
        </div>
        <div>
          <dt className="text-ink-soft">Specimen density</dt>
          <dd className="figure font-bold" data-testid="specimen-density">
            {estimate.specimenDensity.toFixed(3)} g/cm³
          </dd>
        </div>
        <div>
          <dt className="text-ink-soft">Volume</dt>
          <dd className="figure font-bold">{estimate.volumeCm3.toFixed(2)} cm³</dd>
        </div>
      </dl>

      <DensityPicture estimate={estimate} airGrams={airMean} hostDensity={input.hostDensity ?? 2.65} alloyDensity={alloyDensity} unitLabel={fmt} />

      {estimate.warnings.length > 0 && (
        <ul className="flex flex-col gap-2" aria-label="Warnings" data-testid="warnings">
          {estimate.warnings.map((w) => (
            <li key={w.code} className="rounded-md border-2 border-caution p-2 text-sm" data-code={w.code}>
              {w.message}
            </li>
          ))}
        </ul>
      )}

      <fieldset className="flex flex-col gap-2">
        <legend className="field-label">Melt value at your price</legend>
        <div className="flex gap-2">
          <label className="sr-only" htmlFor="price">
            Price per troy ounce
          </label>
          <input id="price" inputMode="decimal" className="field-input figure" placeholder="price per troy oz" value={price} onChange={(e) => setPrice(e.target.value)} />
          <label className="sr-only" htmlFor="currency">
            Currency
          </label>
          <input id="currency" className="field-input w-24" maxLength={3} value={currency} onChange={(e) => setCurrency(e.target.value.toUpperCase())} />
        </div>
        <p className="figure" data-testid="melt-value">
          {value(estimate.fineGoldGrams)}
          {perOz ? ` (range ${value(fLo)} – ${value(fHi)})` : ""}
        </p>
      </fieldset>

      <p className="rounded-md bg-paper p-2 text-sm font-bold">
        An estimate, not an assay. Hydrostatic weighing assumes two materials and a guessed fineness; only an assay says how much
        gold there is. Do not buy or sell on this figure alone — and a specimen can be worth more than its melt value.
      </p>
      <p className="text-xs text-ink-soft">Engine {estimate.engineVersion}</p>
    </section>
  );
}
