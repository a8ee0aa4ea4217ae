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
