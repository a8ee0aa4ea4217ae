"use client";
import dynamic from "next/dynamic";
import type { ClaimView } from "@/lib/entities/claim";

const MapView = dynamic(() => import("@/components/field/screens/map-view"), { ssr: false, loading: () => <div className="sheet h-64 animate-pulse" /> });

/** The club's claims on the map, each labelled (with its production where given). */
export function ClaimsMap({ claims, labels }: { claims: (Omit<ClaimView, "boundary"> & { boundary: unknown })[]; labels: Record<string, string> }) {
  return <MapView claims={claims as ClaimView[]} finds={[]} me={null} tileUrl="" labels={labels} />;
}
