import { ledgerQuerySchema } from "@/lib/club/ledger";
import { withoutBidiControls as plain } from "@/lib/text/safe-text";
import { requireActor } from "@/server/auth/actor";
import { listClaims } from "@/server/club/claims";
import { ledgerExportRows } from "@/server/club/ledger";
import { parseSearchParams, route } from "@/server/http";

/**
 * The club's claims and the filtered finds as GeoJSON (RFC 7946), for a GIS: each claim's
 * outline with its gold profile, and each find the member shares the exact spot of as a point
 * (finds whose members share only the claim are left out). Longitude first, WGS 84.
 */
export const GET = route(async (req) => {
  await requireActor(req, "viewLedger", "club");
  const query = parseSearchParams(req, ledgerQuerySchema, "ledger");
  const claims = listClaims()
    .filter((c) => c.boundary)
    .map((c) => ({
      type: "Feature" as const,
      geometry: c.boundary,
      properties: {
        kind: "claim",
        id: c.id,
        name: plain(c.name),
        claimKind: c.kind,
        agencyRef: c.agencyRef,
        active: c.active,
        fineness: c.fineness,
        finenessLow: c.finenessLow,
        finenessHigh: c.finenessHigh,
        hostDensity: c.hostDensity,
      },
    }));
  const finds = ledgerExportRows(query)
    .filter((r) => r.lat !== null && r.lon !== null)
    .map((r) => ({
      type: "Feature" as const,
      geometry: { type: "Point" as const, coordinates: [Number(r.lon!.toFixed(6)), Number(r.lat!.toFixed(6))] },
      properties: {
        kind: "find",
        id: r.id,
        foundOn: r.foundOn,
        member: plain(r.memberName ?? ""),
        claim: r.claimName ? plain(r.claimName) : null,
        findKind: r.kind,
        weightGrams: r.weightGrams,
        fineGrams: r.fineGrams === null ? null : Number(r.fineGrams.toFixed(3)),
        fineBasis: r.fineBasis,
        outsideClaim: r.outsideClaim,
      },
    }));
  return new Response(JSON.stringify({ type: "FeatureCollection", features: [...claims, ...finds] }), {
    headers: {
      "Content-Type": "application/geo+json; charset=utf-8",
      "Content-Disposition": `attachment; filename="lodebook-${new Date().toISOString().slice(0, 10)}.geojson"`,
      "Cache-Control": "no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
});
