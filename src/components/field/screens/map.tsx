"use client";
import { useLiveQuery } from "@/client/live-query";
import dynamic from "next/dynamic";
import { useRouter } from "next/navigation";
import { useMemo } from "react";
import { useClaims, useStoredSettings } from "@/client/hooks";
import { useHashParams } from "@/client/hash-params";
import { NO_POSITION, useDevicePosition } from "@/client/position";
import { saveFind, stripLocal } from "@/client/logbook";
import { useMember } from "@/client/member";
import { requestSync } from "@/client/sync/scheduler";
import { claimAt, formatDecimal, toDms } from "@/lib/geo";

/** Where the map goes, the map's own size, so nothing below it moves when it comes. */
function MapPlace() {
  return <div role="status" aria-label="Loading the map" className="h-[65dvh] w-full animate-pulse rounded-md border-2 border-rule bg-sheet opacity-60" />;
}

// MapLibre is heavy: it loads with this screen only.
const MapView = dynamic(() => import("./map-view"), { ssr: false, loading: MapPlace });

export function MapScreen() {
  const { db } = useMember();
  const router = useRouter();
  const pickFor = useHashParams().get("pick");
  const claims = useClaims(db);
  const finds = useLiveQuery(() => db.finds.toArray(), [db]);
  // Waited for, not taken as the defaults meanwhile: the map is built for one tile address.
  const settings = useStoredSettings(db);
  const { state: position, locate } = useDevicePosition(false);
  const me = position.kind === "found" ? position.position : null;

  const tally = useMemo(() => {
    const byClaim = new Map<string, number>();
    let outside = 0;
    for (const f of finds ?? []) {
      if (f.lat === null || f.lon === null) continue;
      const c = claimAt(f.lat, f.lon, claims ?? []);
      if (c) byClaim.set(c.id, (byClaim.get(c.id) ?? 0) + 1);
      else outside++;
    }
    return { byClaim, outside };
  }, [finds, claims]);

  if (!claims || !finds || !settings) return <MapPlace />;

  const pick = async (lat: number, lon: number) => {
    if (!pickFor) return;
    const find = await db.finds.get(pickFor);
    if (!find) return;
    await saveFind(db, { ...stripLocal(find), lat, lon, accuracyM: null, locationSource: "map", claimId: claimAt(lat, lon, claims)?.id ?? find.claimId });
    requestSync();
    router.push(`/finds/view#id=${pickFor}`);
  };

  return (
    <>
      {pickFor && (
        <p role="status" className="sheet font-bold">
          Tap the spot where you found it.
        </p>
      )}
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <button type="button" className="btn" onClick={locate}>
          {position.kind === "finding" ? "Finding you…" : "Show where I am"}
        </button>
        {me && (
          <p className="figure text-sm">
            You: {formatDecimal(me.lat, me.lon)} · {toDms(me.lat, "lat")} {toDms(me.lon, "lon")} (± {Math.round(me.accuracyM)} m)
          </p>
        )}
        {position.kind === "failed" && (
          <p role="status" className="text-sm">
            {pickFor ? position.message : NO_POSITION[position.reason]}
          </p>
        )}
      </div>
      <MapView
        claims={claims}
        finds={finds}
        me={me}
        tileUrl={settings.tileUrl}
        onPick={pickFor ? pick : undefined}
        onOpenFind={pickFor ? undefined : (id) => router.push(`/finds/view#id=${id}`)}
      />
      <section className="sheet" aria-labelledby="legend-title" data-testid="map-legend">
        <h2 id="legend-title" className="heading-bar mb-2 text-lg">
          Your finds by claim
        </h2>
        <ul>
          {claims.map((c) => (
            <li key={c.id} data-claim={c.name}>
              <strong>{c.name}</strong> ({c.kind}): <span data-testid={`claim-count-${c.id}`}>{tally.byClaim.get(c.id) ?? 0}</span>
            </li>
          ))}
          <li>
            Outside every claim: <span data-testid="outside-count">{tally.outside}</span>
          </li>
        </ul>
        <p className="mt-2 text-sm text-ink-soft">Claim outlines are the club&apos;s drawing, not a survey. Grid lines every 0.005°.</p>
      </section>
    </>
  );
}
