import { goldAlloyDensity } from "./alloy";
import type { ResolvedInput } from "./input";
import { mixtureAlloy, NOISE, weighSpecimen } from "./model";
import { waterDensity } from "./water";

type Pair = [number, number];

export type Ranges = { alloy: Pair; fine: Pair; density: Pair };

/**
 * The lowest and highest gold over the whole input box: every reading at either end, the
 * water temperature, the host density and the fineness (only the finenesses the readings leave
 * possible: see resolveSpecimen in possible.ts).
 *
 * The mixture formula before it is held to [0, mass] is monotonic in each input with the
 * others fixed (linear in the readings; in the host's density its sign follows ρs − ρg; in the
 * water's density through ρw, which turns at 3.98 °C, a candidate when the span straddles it),
 * so its extremes lie on the corners. Holding it to the specimen's mass is not monotonic (the
 * mass moves with the readings too), so the extremes are found first and held after:
 * low = max(0, min(formula, mass)), high = max(0, min(formula's highest, mass's highest)).
 * The low end is attained; the high end may lie a little above what any point reaches, never below.
 */
export function searchRange(r: ResolvedInput): Ranges {
  const s = r.settings;
  const fineLo = r.fineness.lo;
  const fineHi = r.fineness.hi;
  const alloyAtFineLo = s.goldDensity ?? goldAlloyDensity(fineLo);
  const alloyAtFineHi = s.goldDensity ?? goldAlloyDensity(fineHi);

  const formula: Pair = [Infinity, -Infinity];
  const formulaFine: Pair = [Infinity, -Infinity];
  const mass: Pair = [Infinity, -Infinity];
  for (const tempC of r.temps) {
    const rhoW = waterDensity(tempC);
    for (const air of [r.air.lo, r.air.hi]) {
      for (const water of [r.water.lo, r.water.hi]) {
        const w = weighSpecimen(air, water, s, rhoW);
        widen(mass, w.mass);
        for (const host of [r.host.lo, r.host.hi]) {
          const atLo = mixtureAlloy(w, host, alloyAtFineLo);
          const atHi = mixtureAlloy(w, host, alloyAtFineHi);
          widen(formula, atLo);
          widen(formula, atHi);
          widen(formulaFine, (atLo * fineLo) / 1000);
          widen(formulaFine, (atHi * fineHi) / 1000);
        }
      }
    }
  }
  return {
    alloy: [noneBelowNoise(Math.min(formula[0], mass[0]), mass[1]), noneBelowNoise(Math.min(formula[1], mass[1]), mass[1])],
    fine: [
      noneBelowNoise(Math.min(formulaFine[0], (mass[0] * fineLo) / 1000), mass[1]),
      noneBelowNoise(Math.min(formulaFine[1], (mass[1] * fineHi) / 1000), mass[1]),
    ],
    density: r.density,
  };
}

function widen(pair: Pair, v: number) {
  if (v < pair[0]) pair[0] = v;
  if (v > pair[1]) pair[1] = v;
}

/** Gold below rounding noise (a billionth of the specimen) is none: a specimen exactly at the host's density holds 0, not 1e-10 g. */
function noneBelowNoise(v: number, mass: number): number {
  return v > NOISE * mass ? v : 0;
}
