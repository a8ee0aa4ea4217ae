"use client";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { KIND_LABELS } from "@/lib/entities/constants";
import { engineLabel } from "@/components/weigh/engine-label";
import { DEFAULTS } from "@/lib/estimate/defaults";
import type { SpecimenInput } from "@/lib/estimate/types";
import type { ReportedEstimate } from "@/lib/entities/weigh-in";
import { formatGrams, formatWhen, heldAtAnEnd, spreadText } from "@/lib/format";
import type { ThreadEvent } from "@/lib/club/thread";
import { formatDecimal, toDms } from "@/lib/geo";
import { api, ApiError } from "./api";

type FindDetail = {
  timeZone: string;
  find: {
    id: string;
    memberName: string | null;
    claimName: string | null;
    kind: keyof typeof KIND_LABELS;
    weightGrams: number | null;
    depthCm: number | null;
    method: string;
    notes: string;
    lat: number | null;
    lon: number | null;
    accuracyM: number | null;
    foundAt: number;
    positionShared: boolean;
  };
  photos: { id: string }[];
  weighIns: {
    id: string;
    weighedAt: number;
    input: SpecimenInput;
    deviceEstimate: ReportedEstimate;
    serverEstimate: ReportedEstimate;
    engineVersion: string;
    mismatch: boolean;
    scaleName: string | null;
    scaleCheck: { checkedAt: number } | null;
    scaleCheckPassed: boolean | null;
  }[];
  reviews: { id: string; action: "verify" | "query" | "note"; note: string; createdAt: number; officerName: string | null }[];
  thread: ThreadEvent[];
};

const ACTION = { verify: "Verified", query: "Queried", note: "Note" } as const;

/**
 * One weigh-in as the officer reads it: the readings, the server's recomputation with the
 * engine that made it, and the member's device figure where it differs (with its engine).
 */
function WeighInLines({ w, timeZone }: { w: FindDetail["weighIns"][number]; timeZone: string }) {
  const server = w.serverEstimate;
  const device = w.deviceEstimate;
  const u = server.standardUncertainty.fineGoldGrams;
  // Engines from 2.0.0 on say what they assumed; older ones left the defaults implicit (and
  // took pure gold, 1000 ‰, when no fineness was given).
  const host = server.assumptions?.hostDensity ?? w.input.hostDensity ?? DEFAULTS.hostDensity;
  const fineness = server.assumptions?.finenessPermille ?? w.input.finenessPermille ?? 1000;
  const temp = server.assumptions?.waterTempC ?? w.input.waterTempC ?? DEFAULTS.waterTempC;
  // The range the engine worked with: a dense specimen narrows the member's preset (engine 2.1.0 on).
  const [fLo, fHi] = server.assumptions?.finenessRangePermille ?? [fineness, fineness];
  const fineRange = fLo < fHi ? `${Math.round(fLo)}–${Math.round(fHi)}` : "";
  return (
    <>
      <p>
        {formatWhen(w.weighedAt, timeZone)} · {w.input.method} · air {w.input.airGrams.join(", ")} g · water {w.input.waterGrams.join(", ")} g · {temp} °C ·
        host {host.toFixed(2)} · fineness {Math.round(fineness)} ‰{fineRange && ` (${fineRange})`}
      </p>
      <p className="font-bold tabular-nums">
        Server recomputation: {formatGrams(server.fineGoldGrams, "g", u)} fine (
        {spreadText(u, server.range.fineGoldGrams, (g) => formatGrams(g, "g", u), heldAtAnEnd(server))}), {engineLabel(w.engineVersion)}
      </p>
      <ScaleMark w={w} timeZone={timeZone} />
      {w.mismatch && (
        <p className="font-bold text-rust">
          {device.engineVersion === w.engineVersion
            ? `The member's device computed ${formatGrams(device.fineGoldGrams, "g", u)} with the same engine: check its app.`
            : `The member's device computed ${formatGrams(device.fineGoldGrams, "g", u)}, ${engineLabel(device.engineVersion)}.`}
        </p>
      )}
    </>
  );
}

/** Whether the weigh-in was made on a checked scale: the server's verdict on the scale's latest setup check then. */
function ScaleMark({ w, timeZone }: { w: FindDetail["weighIns"][number]; timeZone: string }) {
  const when = w.scaleCheck ? formatWhen(w.scaleCheck.checkedAt, timeZone) : "";
  const scale = w.scaleName ?? "a scale since removed";
  if (w.scaleCheckPassed === true)
    return (
      <p className="text-moss" data-testid="scale-mark" data-standing="passed">
        ✓ Checked scale: {scale}, setup check passed {when}.
      </p>
    );
  if (w.scaleCheckPassed === false)
    return (
      <p className="font-bold text-rust" data-testid="scale-mark" data-standing="failed">
        ⚠ Made on {scale}, whose last setup check ({when}) failed: the rig was off, so this estimate may be too.
      </p>
    );
  return (
    <p className="text-ink-soft" data-testid="scale-mark" data-standing="unchecked">
      {w.scaleName || w.scaleCheck ? `On ${scale}, not checked then.` : "No scale named; the rig was not checked."}
    </p>
  );
}

/** One step of the thread, on the club's clock. */
function ThreadLine({ e, timeZone }: { e: ThreadEvent; timeZone: string }) {
  const when = <time dateTime={new Date(e.at).toISOString()}>{formatWhen(e.at, timeZone)}</time>;
  switch (e.kind) {
    case "review":
      return (
        <>
          <strong className={e.action === "query" ? "text-rust" : e.action === "verify" ? "text-moss" : ""}>{ACTION[e.action]}</strong> by{" "}
          {e.by ?? "a former officer"} · {when} {e.note && `— ${e.note}`}
        </>
      );
    case "answer":
      return (
        <>
          <strong>Answered</strong> by {e.by ?? "the member"} · {when} — {e.note}
        </>
      );
    case "edit":
      return (
        <span className="text-ink-soft">
          The member changed the find ({e.fields.join(", ")}) · {when}
        </span>
      );
    case "weighIn":
      return (
        <span className="text-ink-soft">
          The member {e.removed ? "removed a weigh-in" : "weighed it"} · {when}
        </span>
      );
  }
}

/** A find opened from the ledger: everything about it, and the officer's verify / query / note. */
export function FindPanel({ id, onClose }: { id: string; onClose: () => void }) {
  const client = useQueryClient();
  const { data, error, isPending } = useQuery({ queryKey: ["find", id], queryFn: () => api<FindDetail>(`/api/club/finds/${id}`) });
  const [note, setNote] = useState("");
  const review = useMutation({
    mutationFn: (action: "verify" | "query" | "note") => api(`/api/club/finds/${id}/reviews`, { method: "POST", body: { action, note } }),
    onSuccess: () => {
      setNote("");
      void client.invalidateQueries({ queryKey: ["find", id] });
      void client.invalidateQueries({ queryKey: ["ledger"] });
    },
  });

  return (
    <aside aria-label="Find" className="sheet flex flex-col gap-3" data-testid="find-panel">
      <div className="flex items-center justify-between">
        <h2 className="text-xl font-bold">{data ? `${KIND_LABELS[data.find.kind]} · ${data.find.memberName ?? ""}` : "Find"}</h2>
        <button type="button" className="btn" onClick={onClose}>
          Close
        </button>
      </div>
      {isPending && <p role="status">Loading…</p>}
      {error && <p className="field-error">{(error as Error).message}</p>}
      {data && (
        <>
          <dl className="grid grid-cols-[auto_minmax(0,1fr)] gap-x-4 gap-y-2 text-sm">
            <dt className="text-ink-soft">Found</dt>
            <dd>{formatWhen(data.find.foundAt, data.timeZone)}</dd>
            <dt className="text-ink-soft">Claim</dt>
            <dd>{data.find.claimName ?? "off the club's claims"}</dd>
            <dt className="text-ink-soft">Weight</dt>
            <dd className="figure">{data.find.weightGrams != null ? formatGrams(data.find.weightGrams) : "—"}</dd>
            <dt className="text-ink-soft">Method, depth</dt>
            <dd>
              {data.find.method}
              {data.find.depthCm != null ? `, ${data.find.depthCm} cm` : ""}
            </dd>
            <dt className="text-ink-soft">Position</dt>
            <dd className="tabular-nums">
              {data.find.lat !== null && data.find.lon !== null ? (
                <>
                  <span className="whitespace-nowrap">{formatDecimal(data.find.lat, data.find.lon)}</span>
                  <br />
                  {/* Latitude and longitude each kept whole; the pair wraps between them if it must. */}
                  <span className="whitespace-nowrap">{toDms(data.find.lat, "lat")}</span>{" "}
                  <span className="whitespace-nowrap">{toDms(data.find.lon, "lon")}</span>
                </>
              ) : data.find.positionShared ? (
                "not recorded"
              ) : (
                "the member shares the claim only"
              )}
            </dd>
          </dl>
          {data.find.notes && <p className="text-sm">“{data.find.notes}”</p>}
          {data.photos.length > 0 && (
            <div className="flex flex-wrap gap-2">
              {data.photos.map((p) => (
                // eslint-disable-next-line @next/next/no-img-element -- served by our photo handler, EXIF stripped
                <img key={p.id} src={`/api/photos/${p.id}`} alt="Photo of the find" className="h-28 w-28 rounded-md border border-rule object-cover" />
              ))}
            </div>
          )}
          <section>
            <h3 className="font-bold">Weigh-ins</h3>
            {data.weighIns.length === 0 && <p className="text-sm text-ink-soft">None.</p>}
            {data.weighIns.map((w) => (
              <div key={w.id} className="border-b border-rule py-2 text-sm">
                <WeighInLines w={w} timeZone={data.timeZone} />
              </div>
            ))}
          </section>
          <section>
            <h3 className="font-bold">Query thread</h3>
            {data.thread.length === 0 && <p className="text-sm text-ink-soft">Not reviewed yet.</p>}
            <ol className="text-sm" data-testid="review-history">
              {data.thread.map((e) => (
                <li key={`${e.kind}:${e.id}`} data-kind={e.kind} data-action={e.kind === "review" ? e.action : undefined} className="border-b border-rule py-1">
                  <ThreadLine e={e} timeZone={data.timeZone} />
                </li>
              ))}
            </ol>
          </section>
          <div className="flex flex-col gap-2">
            <label className="flex flex-col">
              <span className="field-label">Note to the member</span>
              <textarea rows={2} className="field-input" value={note} onChange={(e) => setNote(e.target.value)} />
            </label>
            {review.error && (
              <p className="field-error">{review.error instanceof ApiError ? (review.error.fields.note?.[0] ?? review.error.message) : String(review.error)}</p>
            )}
            <div className="flex flex-wrap gap-2">
              <button type="button" className="btn btn-primary" disabled={review.isPending} onClick={() => review.mutate("verify")}>
                Verify
              </button>
              <button type="button" className="btn" disabled={review.isPending} onClick={() => review.mutate("query")}>
                Query
              </button>
              <button type="button" className="btn" disabled={review.isPending} onClick={() => review.mutate("note")}>
                Add a note
              </button>
            </div>
          </div>
          <p className="text-xs text-ink-soft">Figures are estimates from hydrostatic weighing, not assays.</p>
        </>
      )}
    </aside>
  );
}
