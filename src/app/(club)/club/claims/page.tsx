import type { Metadata } from "next";
import { BasemapUpload } from "@/components/club/basemap-upload";
import { ClaimSection } from "@/components/club/claim-section";
import { ClaimsMap } from "@/components/club/claims-map";
import { requirePageActor } from "@/server/auth/current";
import { describeBasemap } from "@/server/basemap/archive-file";
import { maxBasemapBytes } from "@/server/basemap/files";
import { listClaims } from "@/server/club/claims";
import { clubSettings } from "@/server/club/settings";
import { formatWhen } from "@/lib/format";
import { seasonNow } from "@/lib/season";

export const metadata: Metadata = { title: "Claims" };

export default async function ClaimsPage() {
  await requirePageActor("manageClaims", "/club/claims");
  const claims = listClaims();
  const { timeZone } = clubSettings();
  const season = seasonNow(timeZone);
  const basemap = await describeBasemap();
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Claims</h1>
      <ClaimsMap claims={claims} labels={Object.fromEntries(claims.map((c) => [c.id, c.name]))} />
      <BasemapUpload
        initial={basemap.info}
        initialSince={basemap.info ? formatWhen(Date.parse(basemap.info.updatedAt), timeZone) : ""}
        timeZone={timeZone}
        problem={basemap.problem}
        maxBytes={maxBasemapBytes()}
      />
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
