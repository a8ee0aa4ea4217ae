"use client";
import { BarrenRock } from "./barren-rock";
import { ClaimEditor, type EditableClaim } from "./claim-editor";
import { ClaimProfileEditor, type ClaimProfile } from "./claim-profile-editor";
import { RecoveredGold } from "./recovered-gold";

/** Everything an officer does on one claim: its details and outline, gold profile, melts and assays, barren rock. */
export default function ClaimTools({ claim, season }: { claim?: EditableClaim & ClaimProfile; season: number }) {
  if (!claim) return <ClaimEditor />;
  return (
    <div className="mt-3 flex flex-col gap-3">
      <ClaimEditor claim={claim} />
      <ClaimProfileEditor claim={claim} season={season} />
      <RecoveredGold claim={claim} season={season} />
      <BarrenRock claim={claim} season={season} />
    </div>
  );
}
