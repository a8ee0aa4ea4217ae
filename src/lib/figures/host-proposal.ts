/**
 * What a claim's barren-rock weigh-ins say about its host rock's density.
 *
 * Members weigh 5–10 pieces of gold-free vein rock from the claim; each piece's density is the
 * server's recomputation with the estimate engine (air buoyancy corrected, so it is a true
 * density like the host presets). The proposal for a season is their mean, with a range of
 * ± twice their standard deviation (sample, n − 1), never narrower than ± MIN_HOST_HALF_RANGE
 * (0.02 g/cm³: a few pieces can agree by chance, and clean quartz alone spans about that much;
 * our choice), kept within what a claim's profile accepts and centred again, so the value used
 * is the middle of its range. Fewer than MIN_PIECES pieces propose nothing.
 */
export const MIN_HOST_HALF_RANGE = 0.02;
export const MIN_PIECES = 5;
/** What a claim's gold profile accepts for its host rock (lib/club/schemas.ts). */
export const HOST_PROFILE_LIMITS = [1.5, 8] as const;

export type HostProposal = { value: number; low: number; high: number; pieces: number; mean: number; sd: number };

export function proposeHostDensity(densities: readonly number[]): HostProposal | null {
  const n = densities.length;
  if (n < MIN_PIECES) return null;
  const mean = densities.reduce((a, b) => a + b, 0) / n;
  const sd = Math.sqrt(densities.reduce((s, d) => s + (d - mean) ** 2, 0) / (n - 1));
  const half = Math.max(2 * sd, MIN_HOST_HALF_RANGE);
  // Rounded outwards to 0.001 g/cm³, so the range still holds the mean ± half.
  const low = Math.max(HOST_PROFILE_LIMITS[0], Math.floor((mean - half) * 1000) / 1000);
  const high = Math.min(HOST_PROFILE_LIMITS[1], Math.ceil((mean + half) * 1000) / 1000);
  return { value: (low + high) / 2, low, high, pieces: n, mean, sd };
}
