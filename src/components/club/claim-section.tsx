"use client";
import dynamic from "next/dynamic";
import { useState, type ReactNode } from "react";
import type { EditableClaim } from "./claim-editor";
import type { ClaimProfile } from "./claim-profile-editor";

const ClaimTools = dynamic(() => import("./claim-tools"), { loading: () => <p className="mt-3 text-ink-soft">Opening…</p> });

/**
 * A claim's section on the claims screen, closed until the officer opens it: its editors (and
 * their reads of the season's finds) load then, so the screen starts with the plan and the list.
 */
export function ClaimSection({
  summary,
  claim,
  season,
  startOpen = false,
}: {
  summary: ReactNode;
  claim?: EditableClaim & ClaimProfile;
  season: number;
  startOpen?: boolean;
}) {
  const [opened, setOpened] = useState(startOpen);
  return (
    <details className="sheet" open={startOpen || undefined} onToggle={(e) => e.currentTarget.open && setOpened(true)}>
      <summary className="cursor-pointer font-bold">{summary}</summary>
      {opened && <ClaimTools claim={claim} season={season} />}
    </details>
  );
}
