// What the weigh-in flow takes from a claim: kept apart from the presets, so a find's screen
// does not load their texts.

/** A claim's gold profile as the weigh-in flow takes it. */
export type ClaimGold = { name: string; hostDensity: number; hostRange: [number, number]; fineness: number; finenessRange: [number, number] };

/** The profile a device holds for a claim, or null when its server sent none. */
export function claimGoldOf(
  claim:
    | {
        name: string;
        hostDensity?: number;
        hostDensityLow?: number;
        hostDensityHigh?: number;
        fineness?: number;
        finenessLow?: number;
        finenessHigh?: number;
      }
    | null
    | undefined,
): ClaimGold | null {
  if (!claim || claim.hostDensity == null || claim.hostDensityLow == null || claim.hostDensityHigh == null) return null;
  if (claim.fineness == null || claim.finenessLow == null || claim.finenessHigh == null) return null;
  return {
    name: claim.name,
    hostDensity: claim.hostDensity,
    hostRange: [claim.hostDensityLow, claim.hostDensityHigh],
    fineness: claim.fineness,
    finenessRange: [claim.finenessLow, claim.finenessHigh],
  };
}

/** The weigh-in flow's preset id for "this claim's figures". */
export const CLAIM_PRESET = "claim";
