"use client";
import { useQuery } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import type { HostProposal } from "@/lib/figures/host-proposal";
import { MIN_HOST_HALF_RANGE, MIN_PIECES } from "@/lib/figures/host-proposal";
import { formatWhen } from "@/lib/format";
import { api } from "./api";
import type { ClaimProfile } from "./claim-profile-editor";

type Answer = {
  timeZone: string;
  pieces: { id: string; memberName: string | null; weighedAt: number; density: number; scaleCheckPassed: boolean | null }[];
  proposal: HostProposal | null;
};

/**
 * A claim's barren-rock weigh-ins for the season: each piece's density (the server's), and the
 * host density they propose, put into the claim's gold profile with one press.
 */
export function BarrenRock({ claim, season }: { claim: ClaimProfile; season: number }) {
  const router = useRouter();
  const { data } = useQuery({
    queryKey: ["barren-rock", claim.id, season],
    queryFn: () => api<Answer>(`/api/club/barren-rock?claimId=${claim.id}&season=${season}`),
  });
  const [status, setStatus] = useState<string | null>(null);
  const p = data?.proposal;

  async function accept(proposal: HostProposal) {
    try {
      await api(`/api/club/claims/${claim.id}/profile`, {
        method: "PUT",
        body: {
          finenessLow: claim.finenessLow,
          finenessHigh: claim.finenessHigh,
          finenessSource: claim.finenessSource,
          hostDensityLow: proposal.low,
          hostDensityHigh: proposal.high,
          hostDensitySource: `Barren-rock weigh-ins of ${season}: ${proposal.pieces} pieces, mean ${proposal.mean.toFixed(3)} ± 2 × ${proposal.sd.toFixed(3)} g/cm³`,
        },
      });
      setStatus("The claim's host rock is now the proposal. Members' weigh-ins on this claim start from it after their next sync.");
      router.refresh();
    } catch (error) {
      setStatus((error as Error).message);
    }
  }

  return (
    <section className="sheet flex flex-col gap-3" aria-label={`Barren rock on ${claim.name}`}>
      <h3 className="text-lg font-bold">Barren rock, {season}</h3>
      {data && data.pieces.length === 0 && <p className="text-ink-soft">No barren-rock weigh-ins on this claim this season.</p>}
      {data && data.pieces.length > 0 && (
        <table className="w-full text-left text-sm" data-testid="barren-rock-pieces">
          <thead>
            <tr className="border-b-2 border-rule">
              <th className="py-1 pr-2">Weighed</th>
              <th className="py-1 pr-2">By</th>
              <th className="py-1 pr-2 text-right">Density g/cm³</th>
              <th className="py-1">Scale</th>
            </tr>
          </thead>
          <tbody>
            {data.pieces.map((r) => (
              <tr key={r.id} className="border-b border-rule">
                <td className="py-1 pr-2">{formatWhen(r.weighedAt, data.timeZone)}</td>
                <td className="py-1 pr-2">{r.memberName}</td>
                <td className="figure py-1 pr-2 text-right">{r.density.toFixed(3)}</td>
                <td className="py-1">{r.scaleCheckPassed === true ? "✓ checked" : r.scaleCheckPassed === false ? "⚠ check failed" : "not checked"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {data && data.pieces.length > 0 && !p && (
        <p className="text-sm">
          {data.pieces.length} of at least {MIN_PIECES} pieces weighed: no proposal yet.
        </p>
      )}
      {p && (
        <div className="rounded-md border-2 border-rule p-2" data-testid="host-proposal">
          <p>
            {p.pieces} pieces of barren rock say this claim&apos;s host rock is{" "}
            <span className="figure font-bold">
              {p.value.toFixed(3)} g/cm³ ({p.low.toFixed(3)}–{p.high.toFixed(3)})
            </span>
            . The profile now says {claim.hostDensity} g/cm³ ({claim.hostDensityLow}–{claim.hostDensityHigh}).
          </p>
          <button type="button" className="btn mt-2" onClick={() => void accept(p)}>
            Use as the claim&apos;s host rock
          </button>
          <p className="mt-1 text-xs text-ink-soft">
            Mean of the pieces&apos; densities ± twice their standard deviation, at least ± {MIN_HOST_HALF_RANGE} g/cm³ (see the README). Pieces with gold or
            sulphides in them raise it: look at each before you accept.
          </p>
        </div>
      )}
      {status && <p role="status">{status}</p>}
    </section>
  );
}
