// The entities' fixed lists and limits, without their zod schemas, so that screens which only
// show labels do not carry the validator in their first load.

export const FIND_KINDS = ["nugget", "specimen", "flakes", "fines", "crystalline"] as const;
export const KIND_LABELS: Record<(typeof FIND_KINDS)[number], string> = {
  nugget: "Nugget",
  specimen: "Specimen",
  flakes: "Flakes",
  fines: "Fines",
  crystalline: "Crystalline",
};
export const LOCATION_SOURCES = ["device", "photo", "map", "typed"] as const;
/** What a member shares of a find's position with the club. */
export const LOCATION_SHARING = ["exact", "claim"] as const;

export const CLAIM_KINDS = ["placer", "lode"] as const;
export const ROYALTY_KINDS = ["percent_of_value", "grams_per_troy_ounce"] as const;
/** Where the fineness a find was figured with came from. */
export const FINENESS_USED_BASES = ["claim_fineness", "club_fineness"] as const;
export const REVIEW_ACTIONS = ["verify", "query", "note"] as const;
/** Gold recovered from finds: a melt of several, or an assay. */
export const RECOVERY_KINDS = ["melt", "assay"] as const;

export const OUTING_METHODS = ["detecting", "panning", "sluicing", "drywashing", "other"] as const;
export const METHOD_LABELS: Record<(typeof OUTING_METHODS)[number], string> = {
  detecting: "Detecting",
  panning: "Panning",
  sluicing: "Sluicing",
  drywashing: "Drywashing",
  other: "Other",
};

export const PHOTO_TYPES = ["image/jpeg"] as const;
export const MAX_PHOTO_BYTES = 4 * 1024 * 1024;
/** The largest photo the server takes (older devices sent 2048 px). */
export const MAX_PHOTO_EDGE = 2048;
/** What the device sends: long edge and JPEG quality, chosen by the bench's photo study (README). */
export const PHOTO_SEND_EDGE = 1600;
export const PHOTO_SEND_QUALITY = 0.7;
