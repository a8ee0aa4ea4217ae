import type { Scale, ScaleCheckRef, SetupCheck } from "../entities/scale";
import { defaultScaleAccuracy } from "../estimate/defaults";

// A scale profile's standing, for screens: no zod here (types only), so a screen that shows a
// scale's last check does not carry the validator.

/** The scale's latest setup check (by when it was made), or null when it was never checked. */
export function latestCheck(scale: Pick<Scale, "checks">): SetupCheck | null {
  let latest: SetupCheck | null = null;
  for (const c of scale.checks) if (!latest || c.checkedAt >= latest.checkedAt) latest = c;
  return latest;
}

/** What a weigh-in made on this scale now records of it. */
export function checkRefOf(scale: Pick<Scale, "checks"> | null | undefined): ScaleCheckRef | null {
  const c = scale ? latestCheck(scale) : null;
  return c ? { id: c.id, passed: c.result.passed, checkedAt: c.checkedAt } : null;
}

/** The accuracy a scale is taken at: as stated, or the engine's default for its step. */
export function scaleAccuracy(scale: Pick<Scale, "stepGrams" | "accuracyGrams">): number {
  return scale.accuracyGrams ?? defaultScaleAccuracy(scale.stepGrams);
}
