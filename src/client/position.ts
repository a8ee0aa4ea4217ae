"use client";
import { useEffect, useState } from "react";

export type Position = { lat: number; lon: number; accuracyM: number };
export type PositionState =
  | { kind: "idle" }
  | { kind: "finding" }
  | { kind: "found"; position: Position }
  /** `message` offers picking the spot on the map; a screen without that says NO_POSITION[reason]. */
  | { kind: "failed"; message: string; reason: PositionProblem };
type PositionAnswer = Extract<PositionState, { kind: "found" | "failed" }>;
type PositionProblem = "unsupported" | "blocked" | "no-fix";

/** Why there is no position, in plain words, for a screen with no spot to pick instead (the map outside pick mode). */
export const NO_POSITION: Record<PositionProblem, string> = {
  unsupported: "This device cannot tell its position.",
  blocked: "Position is blocked for this app. Allow it in the browser to see where you are.",
  "no-fix": "No position yet (no GPS fix). Try again in the open.",
};

/** The same, with picking the spot on the map (or typing it) as the way on. */
const PICK_INSTEAD: Record<PositionProblem, string> = {
  unsupported: "This device cannot tell its position. Pick the spot on the map or type it.",
  blocked: "Position is blocked for this app. Allow it in the browser, or pick the spot on the map.",
  "no-fix": "No position yet (no GPS fix). Try again in the open, or pick the spot on the map.",
};

const failed = (reason: PositionProblem): PositionAnswer => ({ kind: "failed", reason, message: PICK_INSTEAD[reason] });

/** The device's position, asked for once (high accuracy), with what went wrong in plain words. */
export function askPosition(): Promise<PositionAnswer> {
  return new Promise((resolve) => {
    if (!("geolocation" in navigator)) {
      resolve(failed("unsupported"));
      return;
    }
    navigator.geolocation.getCurrentPosition(
      (p) => resolve({ kind: "found", position: { lat: p.coords.latitude, lon: p.coords.longitude, accuracyM: p.coords.accuracy } }),
      (e) => resolve(failed(e.code === e.PERMISSION_DENIED ? "blocked" : "no-fix")),
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
