"use client";
import { useState } from "react";
import type { SpecimenEstimate } from "@/lib/estimate/types";
import { gramsToTroyOunces, MASS_UNIT_LABELS, MASS_UNITS, type MassUnit } from "@/lib/estimate/units";
import { formatGrams, heldAtAnEnd, spreadText } from "@/lib/format";
import { DensityPicture } from "./density-picture";
import { parseTyped } from "./form-model";
import { warningText } from "./warning-text";

type Props = { estimate: SpecimenEstimate; unit: MassUnit; onUnitChange: (u: MassUnit) => void };

/** The estimate in a prospector's words: figures to the precision their ± allows, the range as the worst case. */
export function EstimatePanel({ estimate, unit, onUnitChange }: Props) {
  const [price, setPrice] = useState("");
  const [currency, setCurrency] = useState("USD");
  const u = estimate.standardUncertainty;
  const fine = (g: number) => formatGrams(g, unit, u.fineGoldGrams);
  const alloy = (g: number) => formatGrams(g, unit, u.goldAlloyGrams);
  const perOz = parseTyped(price);
  const value = (g: number) => (perOz && perOz > 0 ? `${(gramsToTroyOunces(g) * perOz).toFixed(2)} ${currency}` : "—");
  const [fLo, fHi] = estimate.range.fineGoldGrams;
  const [aLo, aHi] = estimate.range.goldAlloyGrams;
  const a = estimate.assumptions;
  const held = heldAtAnEnd(estimate);
  const specimenGrams = estimate.volumeCm3 * estimate.specimenDensity;

  return (
    <section aria-labelledby="estimate-title" aria-live="polite" className="sheet flex flex-col gap-3" data-testid="estimate">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="estimate-title" className="heading-bar text-lg">
          Estimate
        </h2>
        <label className="flex items-center gap-2 text-sm font-bold">
          Show in
          <select className="field-input w-auto" value={unit} onChange={(e) => onUnitChange(e.target.value as MassUnit)}>
            {MASS_UNITS.map((m) => (
              <option key={m} value={m}>
                {MASS_UNIT_LABELS[m]}
              </option>
            ))}
          </select>
        </label>
      </div>

      <div>
        <p className="text-sm text-ink-soft">Fine gold</p>
        <p className="figure text-3xl font-bold" data-testid="fine-gold">
          {fine(estimate.fineGoldGrams)}
        </p>
        <p className="figure" data-testid="fine-range">
          {spreadText(u.fineGoldGrams, [fLo, fHi], fine, held)}
        </p>
        <p className="mt-1 text-xs text-ink-soft" data-testid="spread-explained">
          {held
            ? "No ± here: the figure is held at no gold or at the whole specimen, and a ± would reach past it."
            : "± is one standard uncertainty: the gold is about twice as likely to lie within it as outside it."}{" "}
          “At worst” is the lowest and highest your readings and assumptions allow — scale, water temperature, host rock and fineness all at their worst at
          once.
        </p>
      </div>

      <dl className="grid grid-cols-2 gap-x-4 gap-y-2 text-sm">
        <div>
          <dt className="text-ink-soft">Gold alloy</dt>
          <dd className="figure font-bold" data-testid="alloy-gold">
            {alloy(estimate.goldAlloyGrams)}
          </dd>
          <dd className="figure text-ink-soft">{spreadText(u.goldAlloyGrams, [aLo, aHi], alloy, held)}</dd>
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

      <DensityPicture estimate={estimate} specimenGrams={specimenGrams} unitLabel={alloy} />

      <p className="text-xs text-ink-soft" data-testid="assumptions">
        Worked with: host rock {a.hostDensity.toFixed(2)} g/cm³ ({a.hostDensityRange[0].toFixed(2)}–{a.hostDensityRange[1].toFixed(2)}) · gold{" "}
        {Math.round(a.finenessPermille)} ‰ ({Math.round(a.finenessRangePermille[0])}–{Math.round(a.finenessRangePermille[1])}), alloy{" "}
        {a.goldAlloyDensity.toFixed(2)} g/cm³ · water {a.waterTempC.toFixed(1)} °C ({a.waterTempRangeC[0].toFixed(1)}–{a.waterTempRangeC[1].toFixed(1)}) · scale
        ± {a.scaleAccuracyGrams.toFixed(3)} g a reading ·{" "}
        {a.airBuoyancyCorrection ? "air buoyancy corrected (OIML D 28)" : "no air-buoyancy correction (textbook figure)"}
      </p>

      {estimate.warnings.length > 0 && (
        <ul className="flex flex-col gap-2" aria-label="Warnings" data-testid="warnings">
          {estimate.warnings.map((w, i) => (
            <li key={`${w.code}-${i}`} className="rounded-md border-2 border-caution p-2 text-sm" data-code={w.code}>
              {warningText(w, alloy)}
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
          <input
            id="price"
            inputMode="decimal"
            className="field-input figure"
            placeholder="price per troy oz"
            value={price}
            onChange={(e) => setPrice(e.target.value)}
          />
          <label className="sr-only" htmlFor="currency">
            Currency
          </label>
          <input id="currency" className="field-input w-24" maxLength={3} value={currency} onChange={(e) => setCurrency(e.target.value.toUpperCase())} />
        </div>
        <p className="figure" data-testid="melt-value">
          {value(estimate.fineGoldGrams)}
          {perOz ? ` (at worst ${value(fLo)} – ${value(fHi)})` : ""}
        </p>
      </fieldset>

      <p className="rounded-md bg-paper p-2 text-sm font-bold">
        An estimate, not an assay. Hydrostatic weighing assumes two materials and a guessed fineness; only an assay says how much gold there is. Do not buy or
        sell on this figure alone — and a specimen can be worth more than its melt value.
      </p>
      <p className="text-xs text-ink-soft">Engine {estimate.engineVersion}</p>
    </section>
  );
}
