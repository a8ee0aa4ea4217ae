"use client";
import { useLiveQuery } from "@/client/live-query";
import { lazy, Suspense, useState } from "react";
import { useClaims, useSettings } from "@/client/hooks";
import { deleteBarrenRock, newId, saveBarrenRock } from "@/client/logbook";
import { useMember } from "@/client/member";
import { requestSync } from "@/client/sync/scheduler";
import { MIN_PIECES, proposeHostDensity } from "@/lib/figures/host-proposal";
import { formatWhen } from "@/lib/format";
import { Skeleton } from "../skeleton";

const BarrenRockFlow = lazy(() => import("@/components/weigh/barren-rock-flow").then((m) => ({ default: m.BarrenRockFlow })));

/**
 * Barren-rock weigh-ins: pieces of gold-free vein rock from a claim, weighed on the same rig as
 * specimens. Their densities go to the club, where an officer can make their mean and spread the
 * claim's host-rock figure.
 */
export function BarrenRockScreen() {
  const { db } = useMember();
  const claims = useClaims(db) ?? [];
  const settings = useSettings(db);
  const [claimId, setClaimId] = useState("");
  const chosen = claimId || claims[0]?.id || "";
  const pieces = useLiveQuery(() => db.barrenRocks.where("claimId").equals(chosen).sortBy("weighedAt"), [db, chosen]);
  const scales = useLiveQuery(() => db.scales.toArray(), [db]);
  const densities = (pieces ?? []).map((p) => p.deviceDensity);
  const proposal = proposeHostDensity(densities);
  const claim = claims.find((c) => c.id === chosen);

  return (
    <>
      {claims.length === 0 ? (
        <p>The club&apos;s claims arrive with camp sync.</p>
      ) : (
        <label className="flex flex-col">
          <span className="field-label">Claim</span>
          <select className="field-input" value={chosen} onChange={(e) => setClaimId(e.target.value)}>
            {claims.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
        </label>
      )}
      {claim && (
        <section className="sheet flex flex-col gap-2" aria-label={`Pieces from ${claim.name}`}>
          <h2 className="heading-bar self-start text-lg">Pieces from {claim.name}</h2>
          {pieces === undefined ? (
            <Skeleton lines={1} />
          ) : pieces.length === 0 ? (
            <p className="text-ink-soft">None weighed yet.</p>
          ) : (
            <ul className="text-sm" data-testid="barren-pieces">
              {pieces.map((p) => (
                <li key={p.id} className="flex items-baseline justify-between gap-2 border-b border-rule py-1">
                  <span>{formatWhen(p.weighedAt)}</span>
                  <span className="figure font-bold">{p.deviceDensity.toFixed(3)} g/cm³</span>
                  <button
                    type="button"
                    className="btn px-2 text-sm"
                    onClick={async () => {
                      await deleteBarrenRock(db, p.id);
                      requestSync();
                    }}
                  >
                    Remove
                  </button>
                </li>
              ))}
            </ul>
          )}
          <p className="text-sm" data-testid="barren-summary">
            {proposal
              ? `${proposal.pieces} pieces: mean ${proposal.mean.toFixed(3)} g/cm³, spread ± ${proposal.sd.toFixed(3)}. The officers can make ${proposal.low.toFixed(3)}–${proposal.high.toFixed(3)} the claim's host rock.`
              : `${densities.length} of at least ${MIN_PIECES} pieces weighed.`}
          </p>
        </section>
      )}
      {claim && (
        <Suspense fallback={<Skeleton />}>
          <BarrenRockFlow
            scales={scales ?? []}
            initial={{ resolution: settings.scaleResolution, tempUnit: settings.tempUnit, readingUnit: "g" }}
            onSave={async (piece) => {
              await saveBarrenRock(db, {
                id: newId(),
                claimId: claim.id,
                input: piece.input,
                deviceDensity: piece.density,
                weighedAt: Date.now(),
                scaleId: piece.scaleId,
                scaleCheck: piece.scaleCheck,
                notes: "",
              });
              requestSync();
            }}
          />
        </Suspense>
      )}
    </>
  );
}
