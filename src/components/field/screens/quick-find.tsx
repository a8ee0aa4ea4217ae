"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useClaims, useCurrentOuting, useSettings } from "@/client/hooks";
import { useDevicePosition } from "@/client/position";
import { LocalValidationError, newId, saveFind } from "@/client/logbook";
import { useMember } from "@/client/member";
import { requestSync } from "@/client/sync/scheduler";
import { FieldError } from "@/components/field-error";
import { FIND_KINDS, KIND_LABELS } from "@/lib/entities/constants";
import type { FindKind } from "@/lib/entities/find";
import { convertMass, toGrams } from "@/lib/estimate/units";
import { claimAt } from "@/lib/geo";
import { readNumber } from "@/lib/parse-number";
import { LocationLine } from "../location-line";

/** Log a find in seconds, one-handed: tap the kind, type the weight, tap save. */
export function QuickFindScreen() {
  const { db } = useMember();
  const router = useRouter();
  const claims = useClaims(db) ?? [];
  const outing = useCurrentOuting(db);
  const settings = useSettings(db);
  const { state: position, locate } = useDevicePosition(true);
  const [kind, setKind] = useState<FindKind | null>(null);
  const [weight, setWeight] = useState("");
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [saving, setSaving] = useState(false);
  const unit = settings.massUnit;
  const here = position.kind === "found" ? position.position : null;

  async function save() {
    const fields: Record<string, string[]> = {};
    if (!kind) fields.kind = ["Choose what you found."];
    const { value: w, error } = readNumber(weight, { label: "weight", above: 0, max: convertMass(100_000, unit), unit });
    if (error) fields.weightGrams = [error];
    if (Object.keys(fields).length) return setErrors(fields);
    setSaving(true);
    try {
      const claim = here ? claimAt(here.lat, here.lon, claims) : undefined;
      const find = await saveFind(db, {
        id: newId(),
        outingId: outing?.id ?? null,
        claimId: claim?.id ?? outing?.claimId ?? null,
        kind: kind!,
        weightGrams: w === undefined ? null : toGrams(w, unit),
        purity: null,
        depthCm: null,
        method: outing?.method ?? "detecting",
        notes: "",
        lat: here?.lat ?? null,
        lon: here?.lon ?? null,
        accuracyM: here?.accuracyM ?? null,
        locationSource: here ? "device" : null,
        foundAt: Date.now(),
      });
      requestSync();
      router.push(`/finds/view#id=${find.id}&saved=1`);
    } catch (error) {
      if (error instanceof LocalValidationError) setErrors(error.fields);
      else throw error;
      setSaving(false);
    }
  }

  return (
    <form
      className="flex flex-col gap-5"
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
      noValidate
    >
      <fieldset>
        <legend className="field-label">What did you find?</legend>
        <div className="grid grid-cols-2 gap-2 sm:grid-cols-3">
          {FIND_KINDS.map((k) => (
            <button
              key={k}
              type="button"
              aria-pressed={kind === k}
              onClick={() => setKind(k)}
              className={`btn min-h-[56px] text-lg ${kind === k ? "btn-primary" : ""}`}
            >
              {KIND_LABELS[k]}
            </button>
          ))}
        </div>
        <FieldError messages={errors.kind} />
      </fieldset>

      <div>
        <label htmlFor="weight" className="field-label">
          Weight ({unit}) — optional
        </label>
        <input
          id="weight"
          inputMode="decimal"
          autoComplete="off"
          className="field-input figure text-xl"
          value={weight}
          onChange={(e) => setWeight(e.target.value)}
          aria-invalid={!!errors.weightGrams}
        />
        <FieldError messages={errors.weightGrams} />
      </div>

      {/* The position's button shares the heading's line, high in the section: lower down, the held Save covers it on a phone. */}
      <section className="sheet flex flex-col gap-2" aria-label="Where">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <p className="field-label mb-0">Where</p>
          <button type="button" className="btn" onClick={locate}>
            {here ? "Update my position" : "Try my position again"}
          </button>
        </div>
        {position.kind === "finding" && <p role="status">Finding your position…</p>}
        {position.kind === "failed" && (
          <p role="status" className="text-rust">
            {position.message}
          </p>
        )}
        {here && <LocationLine lat={here.lat} lon={here.lon} accuracyM={here.accuracyM} source="device" claims={claims} />}
        <p className="text-sm text-ink-soft">You can also set the spot later, from a photo or on the map.</p>
      </section>

      {/* Held above the tab bar while the form runs on below it: one thumb, one tap, whatever the screen's height. */}
      <button
        type="submit"
        className="btn btn-primary held-at-bottom sticky bottom-[calc(var(--tab-bar-room,0px)_+_0.5rem)] z-10 min-h-[60px] text-xl shadow-lg"
        disabled={saving}
      >
        {saving ? "Saving…" : "Save the find"}
      </button>
      {outing && <p className="text-sm text-ink-soft">It goes with today&apos;s outing.</p>}
    </form>
  );
}
