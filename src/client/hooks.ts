"use client";
import { useLiveQuery } from "dexie-react-hooks";
import { usePathname } from "next/navigation";
import { useEffect, useState } from "react";
import type { LodebookDb } from "./device-db";
import { DEFAULT_SETTINGS, readSettings, type MemberSettings } from "./settings";

export function useClaims(db: LodebookDb) {
  return useLiveQuery(() => db.claims.toArray().then((c) => c.sort((a, b) => a.name.localeCompare(b.name))), [db]);
}

export function useSettings(db: LodebookDb): MemberSettings {
  return useLiveQuery(() => readSettings(db), [db]) ?? DEFAULT_SETTINGS;
}

/** The outing not yet ended, if any: where quick finds go. */
export function useCurrentOuting(db: LodebookDb) {
  return useLiveQuery(async () => (await db.outings.orderBy("startedAt").reverse().filter((o) => o.endedAt === null).first()) ?? null, [db]);
}

export type Position = { lat: number; lon: number; accuracyM: number };
export type PositionState = { kind: "idle" } | { kind: "finding" } | { kind: "found"; position: Position } | { kind: "failed"; message: string };

/** The device's position, asked for once (high accuracy), with what went wrong in plain words. */
export function useDevicePosition(auto: boolean) {
  const [state, setState] = useState<PositionState>(auto ? { kind: "finding" } : { kind: "idle" });
  const ask = () => {
    if (!("geolocation" in navigator)) {
      queueMicrotask(() => setState({ kind: "failed", message: "This device cannot tell its position. Pick the spot on the map or type it." }));
      return;
    }
    navigator.geolocation.getCurrentPosition(
      (p) => setState({ kind: "found", position: { lat: p.coords.latitude, lon: p.coords.longitude, accuracyM: p.coords.accuracy } }),
      (e) =>
        setState({
          kind: "failed",
          message: e.code === e.PERMISSION_DENIED ? "Position is blocked for this app. Allow it in the browser, or pick the spot on the map." : "No position yet (no GPS fix). Try again in the open, or pick the spot on the map.",
        }),
      { enableHighAccuracy: true, timeout: 20_000, maximumAge: 30_000 },
    );
  };
  const locate = () => {
    setState({ kind: "finding" });
    ask();
  };
  useEffect(() => {
    if (auto) ask();
  }, [auto]);
  return { state, locate };
}

function readHash(): URLSearchParams {
  return new URLSearchParams(typeof window === "undefined" ? "" : window.location.hash.slice(1));
}

/**
 * Parameters of the member screens ride in the URL's hash (`/finds/view#id=…`): the page the
 * service worker stored for the path then serves any record, with no signal.
 */
export function useHashParams(): URLSearchParams {
  const pathname = usePathname();
  const [params, setParams] = useState<URLSearchParams>(() => new URLSearchParams());
  useEffect(() => {
    const read = () => setParams(readHash());
    queueMicrotask(read);
    window.addEventListener("hashchange", read);
    window.addEventListener("popstate", read);
    return () => {
      window.removeEventListener("hashchange", read);
      window.removeEventListener("popstate", read);
    };
  }, [pathname]);
  return params;
}
