import { FINENESS_PRESETS, HOST_PRESETS } from "../estimate/presets";

const natural = FINENESS_PRESETS.find((p) => p.id === "natural")!;
const quartz = HOST_PRESETS.find((p) => p.id === "quartz")!;

/** What a new claim's gold profile starts from: the club's presets, named as the source. */
export const CLAIM_PROFILE_DEFAULTS = {
  fineness: natural.fineness,
  finenessLow: natural.range[0],
  finenessHigh: natural.range[1],
  finenessSource: `Club preset: ${natural.label.toLowerCase()} (${natural.source})`,
  hostDensity: quartz.density,
  hostDensityLow: quartz.range[0],
  hostDensityHigh: quartz.range[1],
  hostDensitySource: `Club preset: ${quartz.label.toLowerCase()} (${quartz.source})`,
} as const;

/** The fineness gold found off any claim is figured with. */
export const CLUB_FINENESS = { value: natural.fineness, low: natural.range[0], high: natural.range[1] } as const;

/** A claim's gold profile as the weigh-in flow takes it. */
export type ClaimGold = { name: string; hostDensity: number; hostRange: [number, number]; fineness: number; finenessRange: [number, number] };

/** The profile a device holds for a claim, or null when its server sent none. */
export function claimGoldOf(claim: {
  name: string;
  hostDensity?: number;
  hostDensityLow?: number;
  hostDensityHigh?: number;
  fineness?: number;
  finenessLow?: number;
  finenessHigh?: number;
} | null | undefined): ClaimGold | null {
  if (!claim || claim.hostDensity == null || claim.hostDensityLow == null || claim.hostDensityHigh == null) return null;
  if (claim.fineness == null || claim.finenessLow == null || claim.finenessHigh == null) return null;
  return { name: claim.name, hostDensity: claim.hostDensity, hostRange: [claim.hostDensityLow, claim.hostDensityHigh], fineness: claim.fineness, finenessRange: [claim.finenessLow, claim.finenessHigh] };
}

/** The weigh-in flow's preset id for "this claim's figures". */
export const CLAIM_PRESET = "claim";
