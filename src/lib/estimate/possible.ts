import { finenessAtDensity, GOLD_DENSITY, goldAlloyDensity } from "./alloy";
import { EstimateInputError } from "./errors";
import { rectangular, resolveInput, type ResolvedInput } from "./input";
import { weighSpecimen } from "./model";
import type { SpecimenInput } from "./types";
import { waterDensity } from "./water";

/**
 * A specimen's input, resolved for its gold: as resolveInput, then held to what a specimen can
 * be. Nothing is denser than its densest part, the gold alloy:
 * - denser than pure gold even at the lightest the readings allow: the readings are wrong,
 *   and no figure is given;
 * - denser than the finest gold allowed even so: the fineness assumption is (as a host rock
 *   lighter than the specimen makes the host assumption), and the gold is held at that finest
 *   fineness, which the denser_than_alloy warning says;
 * - otherwise the finenesses whose alloy is lighter than that lightest specimen are
 *   impossible, and the range keeps only the rest, re-centred (fineness_narrowed): a specimen
 *   of 18 g/cm³ holds gold of at least 913 ‰, whatever "natural gold" allowed.
 * A density measurement (a setup check, barren rock) has no gold and uses resolveInput alone.
 */
export function resolveSpecimen(input: SpecimenInput): ResolvedInput {
  const r = resolveInput(input);
  const lightest = r.density[0];
  if (lightest > GOLD_DENSITY) {
    const central = weighSpecimen(r.air.value, r.water.value, r.settings, waterDensity(r.tempC.value)).density;
    const [atLeast, gold] = apart(lightest, GOLD_DENSITY);
    throw new EstimateInputError(
      "denser_than_gold",
      "waterGrams",
      `These readings make the specimen ${central.toFixed(2)} g/cm³, and at least ${atLeast} within the scale's accuracy: denser than pure gold (${gold}). Re-check the readings and the tare.`,
    );
  }
  const { fineness } = r;
  if (r.settings.goldDensity !== undefined || fineness.lo === fineness.hi) return r;
  const floor = Math.min(finenessAtDensity(lightest), fineness.hi);
  if (floor <= fineness.lo) return r;
  // The value given inside the range is no longer what the range's centre means: the
  // narrowing says what was used instead.
  const notCentred = r.notCentred.filter((n) => n.quantity !== "finenessPermille");
  if (lightest > goldAlloyDensity(fineness.hi)) return { ...r, notCentred, fineness: rectangular(fineness.hi, fineness.hi, fineness.hi) };
  return {
    ...r,
    notCentred,
    fineness: rectangular((floor + fineness.hi) / 2, floor, fineness.hi),
    finenessNarrowed: { given: [fineness.lo, fineness.hi], used: [floor, fineness.hi], densityLow: lightest },
  };
}

/** Two densities written to as many places (2 to 6) as tell them apart: "at least 19.3204" beside "19.3200", not 19.32 twice. */
export function apart(a: number, b: number): [string, string] {
  for (let places = 2; places < 6; places++) if (a.toFixed(places) !== b.toFixed(places)) return [a.toFixed(places), b.toFixed(places)];
  return [a.toFixed(6), b.toFixed(6)];
}
