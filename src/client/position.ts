"use client";
import { useEffect, useState } from "react";

export type Position = { lat: number; lon: number; accuracyM: number };
export type PositionState =
  | { kind: "idle" }
  | { kind: "finding" }
  | { kind: "found"; position: Position }
  /** `reason` lets a screen say it in its own words (the map has no spot to pick outside pick mode). */
  | { kind: "failed"; message: string; reason: "unsupported" | "blocked" | "no-fix" };
type PositionAnswer = Extract<PositionState, { kind: "found" | "failed" }>;

/** The device's position, asked for once (high accuracy), with what went wrong in plain words. */
export function askPosition(): Promise<PositionAnswer> {
  return new Promise((resolve) => {
    if (!("geolocation" in navigator)) {
      resolve({ kind: "failed", reason: "unsupported", message: "This device cannot tell its position. Pick the spot on the map or type it." });
      return;
    }
    navigator.geolocation.getCurrentPosition(
      (p) => resolve({ kind: "found", position: { lat: p.coords.latitude, lon: p.coords.longitude, accuracyM: p.coords.accuracy } }),
      (e) =>
        resolve({
          kind: "failed",
          reason: e.code === e.PERMISSION_DENIED ? "blocked" : "no-fix",
          message:
            e.code === e.PERMISSION_DENIED
              ? "Position is blocked for this app. Allow it in the browser, or pick the spot on the map."
              : "No position yet (no GPS fix). Try again in the open, or pick the spot on the map.",
        }),
      { enableHighAccuracy: true, timeout: 20_000, maximumAge: 30_000 },
    );
  });
}

/** The device's position as screen state: asked for at once when `auto`, again with `locate`. */
export function useDevicePosition(auto: boolean) {
  const [state, setState] = useState<PositionState>(auto ? { kind: "finding" } : { kind: "idle" });
  const locate = () => {
    setState({ kind: "finding" });
    void askPosition().then(setState);
  };
  useEffect(() => {
    if (auto) void askPosition().then(setState);
  }, [auto]);
  return { state, locate };
}
