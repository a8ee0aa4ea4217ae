import type { Metadata } from "next";
import { ClaimSection } from "@/components/club/claim-section";
import { ClaimsMap } from "@/components/club/claims-map";
import { requirePageActor } from "@/server/auth/current";
import { listClaims } from "@/server/club/claims";
import { clubSettings } from "@/server/club/settings";
import { seasonNow } from "@/lib/season";

export const metadata: Metadata = { title: "Claims" };

export default async function ClaimsPage() {
  await requirePageActor("manageClaims", "/club/claims");
  const claims = listClaims();
  const season = seasonNow(clubSettings().timeZone);
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Claims</h1>
      <ClaimsMap claims={claims} labels={Object.fromEntries(claims.map((c) => [c.id, c.name]))} />
      {claims.map((c) => (
        <ClaimSection
          key={c.id}
          claim={{ ...c, boundary: c.boundary ?? null }}
          season={season}
          summary={`${c.name} · ${c.kind}${c.agencyRef ? ` · ${c.agencyRef}` : ""}${c.active ? "" : " · inactive"} · gold ${c.finenessLow}–${c.finenessHigh} ‰`}
        />
      ))}
      <ClaimSection summary={<span className="heading-bar text-lg">Add a claim</span>} season={season} startOpen={claims.length === 0} />
    </div>
  );
}
