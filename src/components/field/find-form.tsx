"use client";
import { useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import type { LocalFind } from "@/client/device-db";
import type { MemberSettings } from "@/client/settings";
import { FieldError } from "@/components/field-error";
import { parseTyped } from "@/lib/parse-number";
import type { ClaimView } from "@/lib/entities/claim";
import { FIND_KINDS, KIND_LABELS } from "@/lib/entities/constants";
import type { Find } from "@/lib/entities/find";
import { convertMass, toGrams } from "@/lib/estimate/units";
import { claimAt } from "@/lib/geo";
import { formatWhen, toLocalInput } from "@/lib/format";
import { beyondClockSlack } from "@/lib/time/ahead";
import type { FindFormValues } from "./form-schemas";
import { lazyZodResolver } from "./lazy-resolver";
import { ClaimOptions, MethodOptions } from "./options";

type FormValues = FindFormValues;

type Props = { find: LocalFind; claims: ClaimView[]; settings: MemberSettings; onSave: (find: Find) => Promise<void> };

/**
 * When the position typed lies in another claim than the one chosen, says so and offers the
 * switch; when it lies outside the chosen claim and every other, says that (boundaries are the
 * club's drawing, so this is a prompt, not a refusal).
 */
function ClaimCheck({
  lat,
  lon,
  claimId,
  claims,
  onSwitch,
}: {
  lat: string;
  lon: string;
  claimId: string;
  claims: ClaimView[];
  onSwitch: (id: string) => void;
}) {
  const la = parseTyped(lat ?? "");
  const lo = parseTyped(lon ?? "");
  if (la === undefined || lo === undefined || Number.isNaN(la) || Number.isNaN(lo) || Math.abs(la) > 90 || Math.abs(lo) > 180) return null;
  const at = claimAt(la, lo, claims);
  const chosen = claims.find((c) => c.id === claimId);
  if (at && at.id !== claimId) {
    return (
      <p className="col-span-2 rounded-md border-2 border-caution p-2 text-sm" role="status" data-testid="claim-check">
        This position is inside <strong>{at.name}</strong>
        {chosen ? `, not ${chosen.name}` : ""}.{" "}
        <button type="button" className="btn ml-1 px-2 text-sm" onClick={() => onSwitch(at.id)}>
          Record it on {at.name}
        </button>
      </p>
    );
  }
  if (!at && chosen?.boundary) {
    return (
      <p className="col-span-2 rounded-md border-2 border-caution p-2 text-sm" role="status" data-testid="claim-check">
        This position is outside {chosen.name}&apos;s boundary. Check the position or the claim.
      </p>
    );
  }
  return null;
}

/** Everything about a find, editable; the shared find schema checks it again on save. */
export function FindForm({ find, claims, settings, onSave }: Props) {
  const unit = settings.massUnit;
  const { register, handleSubmit, formState, setError, control, setValue } = useForm<FormValues>({
    resolver: lazyZodResolver(async () => (await import("./form-schemas")).findFormSchema),
    // A sync can update the record while the member types: keep what they have changed.
    resetOptions: { keepDirtyValues: true },
    values: {
      kind: find.kind,
      weight: find.weightGrams == null ? "" : String(Number(convertMass(find.weightGrams, unit).toFixed(4))),
      purity: find.purity == null ? "" : String(find.purity),
      depthCm: find.depthCm == null ? "" : String(find.depthCm),
      method: find.method,
      claimId: find.claimId ?? "",
      notes: find.notes,
      foundAt: toLocalInput(find.foundAt),
      lat: find.lat == null ? "" : String(find.lat),
      lon: find.lon == null ? "" : String(find.lon),
    },
  });
  const e = formState.errors;
  const [typedLat, typedLon, chosenClaim] = useWatch({ control, name: ["lat", "lon", "claimId"] });
  // Not formState.isSubmitSuccessful: saving changes the record, and new values reset the form.
  const [saved, setSaved] = useState(false);
  // A date more than a day ahead of this phone's clock is saved only once the member says it is right.
  const [aheadConfirmed, setAheadConfirmed] = useState<number | null>(null);
  const [aheadAsked, setAheadAsked] = useState<number | null>(null);

  const submit = handleSubmit(async (v) => {
    setSaved(false);
    const foundAt = v.foundAt === toLocalInput(find.foundAt) ? Math.round(find.foundAt) : new Date(v.foundAt).getTime();
    if (foundAt !== Math.round(find.foundAt) && beyondClockSlack(foundAt) && aheadConfirmed !== foundAt) {
      setAheadAsked(foundAt);
      setError("foundAt", { message: `That is ${formatWhen(foundAt)}, more than a day after this phone's clock. Check the date, or confirm it below.` });
      return;
    }
    const lat = parseTyped(v.lat) ?? null;
    const lon = parseTyped(v.lon) ?? null;
    const moved = lat !== find.lat || lon !== find.lon;
    const weight = parseTyped(v.weight);
    try {
      await onSave({
        id: find.id,
        outingId: find.outingId,
        claimId: v.claimId || null,
        kind: v.kind,
        weightGrams: weight === undefined ? null : toGrams(weight, unit),
        purity: parseTyped(v.purity) ?? null,
        depthCm: parseTyped(v.depthCm) ?? null,
        method: v.method,
        notes: v.notes,
        lat,
        lon,
        accuracyM: moved ? null : find.accuracyM,
        locationSource: lat === null ? null : moved ? "typed" : find.locationSource,
        // The field holds minutes: unchanged, it keeps the find's time to the millisecond (else every edit moved it).
        foundAt,
      });
      setSaved(true);
    } catch (error) {
      const fields = (error as { fields?: Record<string, string[]> }).fields;
      if (!fields) throw error;
      for (const [k, msgs] of Object.entries(fields)) setError((k === "weightGrams" ? "weight" : k) as keyof FormValues, { message: msgs[0] });
    }
  });

  return (
    <form onSubmit={submit} className="sheet flex flex-col gap-4" noValidate aria-label="Find details">
      <div className="grid grid-cols-2 gap-3">
        <label className="flex flex-col">
          <span className="field-label">Kind</span>
          <select className="field-input" {...register("kind")}>
            {FIND_KINDS.map((k) => (
              <option key={k} value={k}>
                {KIND_LABELS[k]}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col">
          <span className="field-label">Weight ({unit})</span>
          <input inputMode="decimal" className="field-input figure" aria-invalid={!!e.weight} {...register("weight")} />
          <FieldError messages={e.weight?.message ? [e.weight.message] : undefined} />
        </label>
        <label className="flex flex-col">
          <span className="field-label">Purity if known (‰)</span>
          <input inputMode="decimal" className="field-input figure" aria-invalid={!!e.purity} aria-describedby="purity-hint" {...register("purity")} />
          <span id="purity-hint" className="text-sm text-ink-soft">
            From a buyer&apos;s test or an assay; otherwise the claim&apos;s fineness is used.
          </span>
          <FieldError messages={e.purity?.message ? [e.purity.message] : undefined} />
        </label>
        <label className="flex flex-col">
          <span className="field-label">Depth (cm)</span>
          <input inputMode="decimal" className="field-input figure" aria-invalid={!!e.depthCm} {...register("depthCm")} />
          <FieldError messages={e.depthCm?.message ? [e.depthCm.message] : undefined} />
        </label>
        <label className="flex flex-col">
          <span className="field-label">Method</span>
          <select className="field-input" {...register("method")}>
            <MethodOptions />
          </select>
        </label>
        <label className="col-span-2 flex flex-col">
          <span className="field-label">Claim</span>
          <select className="field-input" {...register("claimId")}>
            <option value="">Off the club&apos;s claims</option>
            <ClaimOptions claims={claims} current={find.claimId} />
          </select>
        </label>
        <ClaimCheck lat={typedLat} lon={typedLon} claimId={chosenClaim} claims={claims} onSwitch={(id) => setValue("claimId", id, { shouldDirty: true })} />
        <label className="col-span-2 flex flex-col">
          <span className="field-label">Found</span>
          <input type="datetime-local" className="field-input" aria-invalid={!!e.foundAt} {...register("foundAt")} />
          <FieldError messages={e.foundAt?.message ? [e.foundAt.message] : undefined} />
        </label>
        {aheadAsked !== null && (
          <label className="col-span-2 flex items-center gap-2" data-testid="confirm-ahead">
            <input
              type="checkbox"
              className="size-6"
              checked={aheadConfirmed === aheadAsked}
              onChange={(ev) => setAheadConfirmed(ev.target.checked ? aheadAsked : null)}
            />
            The date is right: keep {formatWhen(aheadAsked)}
          </label>
        )}
        <label className="flex flex-col">
          <span className="field-label">Latitude</span>
          <input inputMode="decimal" className="field-input figure" aria-invalid={!!e.lat} {...register("lat")} />
          <FieldError messages={e.lat?.message ? [e.lat.message] : undefined} />
        </label>
        <label className="flex flex-col">
          <span className="field-label">Longitude</span>
          <input inputMode="decimal" className="field-input figure" aria-invalid={!!e.lon} {...register("lon")} />
          <FieldError messages={e.lon?.message ? [e.lon.message] : undefined} />
        </label>
        <label className="col-span-2 flex flex-col">
          <span className="field-label">Notes</span>
          <textarea rows={3} className="field-input" {...register("notes")} />
          <FieldError messages={e.notes?.message ? [e.notes.message] : undefined} />
        </label>
      </div>
      <button type="submit" className="btn btn-primary" disabled={formState.isSubmitting}>
        Save changes
      </button>
      {saved && (
        <p role="status" className="font-bold text-moss">
          Saved on this device.
        </p>
      )}
    </form>
  );
}
