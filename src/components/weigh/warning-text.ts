import type { EstimateWarning } from "@/lib/estimate/types";

/** How a mass is written where the warning is shown (the member's unit and precision). */
export type MassText = (grams: number) => string;

const density = (d: number) => `${d.toFixed(2)} g/cm³`;
const grams = (g: number) => `${g.toFixed(2)} g`;

/**
 * The one place the engine's warnings are put into words. The engine gives codes and numbers
 * (src/lib/estimate/types.ts); results kept on the device and the server carry no sentences.
 */
export function warningText(w: EstimateWarning, mass: MassText): string {
  switch (w.code) {
    case "lighter_than_host":
      return `The specimen (${density(w.params.density)}) is lighter than the lightest host rock you allowed (${density(w.params.hostLow)}). The host assumption is probably wrong: vugs, feldspar or weathered rock make a specimen lighter than clean quartz. The weighing cannot say how much gold it holds; choose a host that fits this rock, or weigh gold-free rock from the same vein to learn it.`;
    case "no_gold_detectable":
      return w.params.highGrams > 0
        ? `The specimen (${density(w.params.density)}) is no denser than the host rock you chose (${density(w.params.host)}), so the estimate is 0. At the far end of your assumptions it could still hold up to ${mass(w.params.highGrams)} of gold alloy.`
        : `The specimen (${density(w.params.density)}) is no denser than the host rock you chose (${density(w.params.host)}): the weighing finds no gold.`;
    case "gold_not_distinguishable":
      return `The specimen (${density(w.params.density)}) is only a little denser than the host rock (${density(w.params.host)}): at the low end of your assumptions there is no gold at all, so the weighing cannot tell this gold from none.`;
    case "denser_than_gold_within_error":
      return `The readings make the specimen ${density(w.params.density)}, a little denser than pure gold (${density(w.params.goldDensity)}), but within your scale's accuracy it could be as light as ${density(w.params.densityLow)}. It is counted as all gold. If it is not a pure-gold piece, re-check the tare and weigh it again.`;
    case "denser_than_alloy":
      return `The specimen (${density(w.params.density)}) is denser than gold of the finest fineness allowed (${density(w.params.alloyDensity)}): the gold is probably finer than that, or a reading is off. The estimate takes the whole specimen as gold of that fineness; an assay would give the true one.`;
    case "range_wider_than_estimate":
      return `The worst-case range (${mass(w.params.lowGrams)} – ${mass(w.params.highGrams)}) is wider than the estimate itself (${mass(w.params.estimateGrams)}): treat the figure as a rough guess.`;
    case "specimen_too_small":
      return `Your scale alone (± ${grams(w.params.accuracyGrams)} a reading) moves the gold figure by ± ${mass(w.params.scaleGrams)}: the specimen pushes aside only ${grams(w.params.displacedGrams)} of water. A finer scale or a larger piece would tell you more.`;
    case "readings_disagree":
      return `Your ${w.params.readings === "air" ? "in-air" : "in-water"} readings differ by ${grams(w.params.spreadGrams)}, more than your scale should (${grams(w.params.limitGrams)}). Re-check: drafts, a line touching the vessel, bubbles, a wet specimen.`;
    case "water_reading_drifts":
      return `The in-water reading crept ${w.params.driftGrams > 0 ? "up" : "down"} by ${grams(Math.abs(w.params.driftGrams))}: water is filling the pores of a porous or vuggy specimen. Leave it soaking until the reading stops moving, brush off bubbles, and use the settled reading. An early reading makes the specimen look lighter and understates the gold.`;
    case "water_reading_unsteady":
      return `The in-water reading moved ${w.params.driftGrams > 0 ? "up" : "down"} by ${grams(Math.abs(w.params.driftGrams))}, the opposite way to pores filling. Look for bubbles gathering, a draft, or the specimen or line touching the vessel, and weigh again.`;
    case "heavy_minerals_count_as_gold":
      return `Everything denser than the host rock counts as gold here. Pyrite, arsenopyrite, galena, magnetite and scheelite raise the density the same way, and at ${density(w.params.density)} they alone could explain it. Look for them before trusting the figure.`;
    case "fineness_narrowed": {
      const [lo, used, hi] = [w.params.givenLow, w.params.usedLow, w.params.givenHigh].map((f) => Math.round(f));
      return `A specimen of at least ${density(w.params.densityLow)} can only hold gold of ${used} ‰ or finer: gold of ${lo} ‰ is lighter than the specimen itself. The estimate uses ${used}–${hi} ‰ of the ${lo}–${hi} ‰ allowed. A piece this dense is mostly gold; an assay would give its fineness.`;
    }
    case "value_not_centred": {
      const what = w.params.quantity === "hostDensity" ? "host density" : "fineness";
      const unit = w.params.quantity === "hostDensity" ? " g/cm³" : " ‰";
      return `Your ${what} (${w.params.given}${unit}) is not the middle of its range; the estimate uses the middle, ${Number(w.params.used.toFixed(4))}${unit}, so the figure and its ± rest on one assumption.`;
    }
  }
}
