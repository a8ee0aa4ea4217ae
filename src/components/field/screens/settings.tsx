"use client";
import { IntentLink } from "@/components/intent-link";
import { lazy, Suspense, useEffect, useState } from "react";
import { useSettings } from "@/client/hooks";
import { useMember } from "@/client/member";
import { saveSettings, type MemberSettings } from "@/client/settings";
import { requestSync } from "@/client/sync/scheduler";
import { FINENESS_PRESETS, HOST_PRESETS } from "@/lib/estimate/presets";
import { MASS_UNIT_LABELS, MASS_UNITS } from "@/lib/estimate/units";

// The basemap's download part loads on its own: Settings' first view does not need it.
const BasemapOffline = lazy(() => import("../basemap-offline"));

type StorageState = { persisted: boolean | null; usage: number | null; quota: number | null };

async function readStorage(): Promise<StorageState> {
  const persisted = (await navigator.storage?.persisted?.()) ?? null;
  const est = await navigator.storage?.estimate?.();
  return { persisted, usage: est?.usage ?? null, quota: est?.quota ?? null };
}

function StorageBlock({ basemapBytes }: { basemapBytes: number | null }) {
  const [state, setState] = useState<StorageState>({ persisted: null, usage: null, quota: null });
  const refresh = () => readStorage().then(setState);
  useEffect(() => {
    readStorage().then(setState);
  }, [basemapBytes]);
  const mb = (n: number | null) => (n === null ? "unknown" : `${(n / 1024 / 1024).toFixed(1)} MB`);
  return (
    <section className="sheet flex flex-col gap-2" aria-labelledby="storage-title">
      <h2 id="storage-title" className="heading-bar self-start text-lg">
        Storage on this device
      </h2>
      <p>
        Lodebook keeps your logbook and photos on this device until camp sync. A browser short of space may clear a website&apos;s data unless it is told the
        data matters. Asking for <strong>lasting storage</strong> tells it so.
      </p>
      <p data-testid="storage-used">
        Using {mb(state.usage)} of {mb(state.quota)} available{basemapBytes !== null && <>, of which the offline basemap {mb(basemapBytes)}</>}.
      </p>
      <p className="font-bold" data-testid="storage-persisted">
        {state.persisted
          ? "Lasting storage: granted."
          : state.persisted === false
            ? "Lasting storage: not yet granted."
            : "Lasting storage: unknown in this browser."}
      </p>
      {!state.persisted && (
        <button
          type="button"
          className="btn self-start"
          onClick={async () => {
            await navigator.storage?.persist?.();
            await refresh();
          }}
        >
          Ask for lasting storage
        </button>
      )}
    </section>
  );
}

export function SettingsScreen() {
  const { db } = useMember();
  const settings = useSettings(db);
  const [saved, setSaved] = useState(false);
  const [basemapBytes, setBasemapBytes] = useState<number | null>(null);
  const change = async (changes: Partial<MemberSettings>) => {
    await saveSettings(db, changes);
    setSaved(true);
    if (changes.locationSharing || changes.mailOnQuery !== undefined) requestSync();
  };
  const select = (key: Exclude<keyof MemberSettings, "mailOnQuery" | "photosLater">, label: string, options: [string, string][]) => (
    <label className="flex flex-col">
      <span className="field-label">{label}</span>
      <select className="field-input" value={settings[key]} onChange={(e) => void change({ [key]: e.target.value })}>
        {options.map(([v, l]) => (
          <option key={v} value={v}>
            {l}
          </option>
        ))}
      </select>
    </label>
  );
  return (
    <>
      <section className="sheet grid gap-3 sm:grid-cols-2" aria-label="Units and weigh-in defaults">
        {select(
          "massUnit",
          "Weights in",
          MASS_UNITS.map((u) => [u, MASS_UNIT_LABELS[u]]),
        )}
        {select("tempUnit", "Temperatures in", [
          ["C", "°C"],
          ["F", "°F"],
        ])}
        {select("scaleResolution", "My scale's step", [
          ["0.1", "0.1 g"],
          ["0.01", "0.01 g"],
          ["0.001", "0.001 g"],
        ])}
        {select(
          "hostPreset",
          "Usual host rock",
          HOST_PRESETS.map((p) => [p.id, p.label]),
        )}
        {select(
          "finenessPreset",
          "Usual gold",
          FINENESS_PRESETS.map((p) => [p.id, p.label]),
        )}
      </section>
      <section className="sheet flex flex-wrap gap-2" aria-label="Rig and rock">
        <IntentLink className="btn" href="/scales">
          Scales and setup checks
        </IntentLink>
        <IntentLink className="btn" href="/barren-rock">
          Barren-rock weigh-ins
        </IntentLink>
      </section>
      <section className="sheet flex flex-col gap-2" aria-label="Privacy">
        {select("locationSharing", "What officers see of where you found things", [
          ["exact", "The exact spot"],
          ["claim", "Only the claim"],
        ])}
        <p className="text-sm text-ink-soft">Your own devices always keep the exact spot. This goes to the club at the next sync.</p>
        <label className="flex items-center gap-2">
          <input type="checkbox" checked={settings.mailOnQuery} onChange={(e) => void change({ mailOnQuery: e.target.checked })} />
          <span>E-mail me when an officer queries one of my finds</span>
        </label>
      </section>
      <section className="sheet flex flex-col gap-2" aria-labelledby="map-title">
        <h2 id="map-title" className="heading-bar self-start text-lg">
          Map
        </h2>
        <label className="flex flex-col">
          <span className="field-label">Map tiles address (optional)</span>
          <input
            className="field-input"
            defaultValue={settings.tileUrl}
            placeholder="https://…/{z}/{x}/{y}.png"
            onBlur={(e) => void change({ tileUrl: e.target.value.trim() })}
          />
        </label>
        <p className="text-sm text-ink-soft">
          The map works without tiles: claims, finds and a coordinate grid. Add a tile address only if you have one you may use.
        </p>
        <Suspense fallback={<p className="text-ink-soft">Loading the basemap&apos;s part…</p>}>
          <BasemapOffline onStored={setBasemapBytes} />
        </Suspense>
      </section>
      <StorageBlock basemapBytes={basemapBytes} />
      {saved && (
        <p role="status" className="font-bold text-moss">
          Saved on this device.
        </p>
      )}
    </>
  );
}
