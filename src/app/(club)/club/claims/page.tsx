import type { Metadata } from "next";
import { BarrenRock } from "@/components/club/barren-rock";
import { BasemapUpload } from "@/components/club/basemap-upload";
import { ClaimEditor } from "@/components/club/claim-editor";
import { ClaimProfileEditor } from "@/components/club/claim-profile-editor";
import { ClaimsMap } from "@/components/club/claims-map";
import { RecoveredGold } from "@/components/club/recovered-gold";
import { requirePageActor } from "@/server/auth/current";
import { describeBasemap } from "@/server/basemap/archive-file";
import { maxBasemapBytes } from "@/server/basemap/files";
import { listClaims } from "@/server/club/claims";
import { clubSettings } from "@/server/club/settings";
import { seasonNow } from "@/lib/season";

export const metadata: Metadata = { title: "Claims" };

export default async function ClaimsPage() {
  await requirePageActor("manageClaims", "/club/claims");
  const claims = listClaims();
  const season = seasonNow(clubSettings().timeZone);
  const basemap = await describeBasemap();
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Claims</h1>
      <ClaimsMap claims={claims} labels={Object.fromEntries(claims.map((c) => [c.id, c.name]))} />
      <BasemapUpload initial={basemap.info} problem={basemap.problem} maxBytes={maxBasemapBytes()} />
      {claims.map((c) => (
        <details key={c.id} className="sheet">
          <summary className="cursor-pointer font-bold">
            {c.name} · {c.kind} {c.agencyRef ? `· ${c.agencyRef}` : ""} {c.active ? "" : "· inactive"} · gold {c.finenessLow}–{c.finenessHigh} ‰
          </summary>
          <div className="mt-3 flex flex-col gap-3">
            <ClaimEditor claim={{ ...c, boundary: c.boundary ?? null }} />
            <ClaimProfileEditor claim={c} season={season} />
            <RecoveredGold claim={c} season={season} />
            <BarrenRock claim={c} season={season} />
          </div>
        </details>
      ))}
      <h2 className="heading-bar self-start text-lg">Add a claim</h2>
      <ClaimEditor />
    </div>
  );
}
