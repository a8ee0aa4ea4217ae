import type { ClaimView } from "@/lib/entities/claim";
import { claimAt, formatDecimal, toDms } from "@/lib/geo";

type Props = { lat: number | null; lon: number | null; accuracyM?: number | null; source?: string | null; claims: ClaimView[] };

const SOURCE: Record<string, string> = { device: "from the device", photo: "from a photo", map: "picked on the map", typed: "typed in" };

/** A position in decimal degrees and in degrees-minutes-seconds, with the claim it falls in. */
export function LocationLine({ lat, lon, accuracyM, source, claims }: Props) {
  if (lat === null || lon === null) return <p className="text-ink-soft">No position yet.</p>;
  const claim = claimAt(lat, lon, claims);
  return (
    <div className="flex flex-col gap-1" data-testid="location">
      <p className="figure font-bold" data-testid="location-decimal">
        {formatDecimal(lat, lon)}
      </p>
      <p className="figure text-sm">
        {toDms(lat, "lat")} · {toDms(lon, "lon")}
      </p>
      <p className="text-sm text-ink-soft">
        {accuracyM != null ? `± ${Math.round(accuracyM)} m, ` : ""}
        {source ? (SOURCE[source] ?? source) : ""}
      </p>
      {claim ? (
        <p className="text-sm font-bold text-moss" data-testid="claim-match">
          Inside {claim.name}
        </p>
      ) : (
        <p className="rounded-md border-2 border-caution p-2 text-sm font-bold" role="alert" data-testid="outside-claims">
          This spot is outside every club claim. Check that you may dig here: the claim owner and the land agency decide. (Claim boundaries here are the
          club&apos;s drawing, not a survey.)
        </p>
      )}
    </div>
  );
}
