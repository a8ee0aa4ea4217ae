import type { Metadata } from "next";
import { FieldScreen } from "@/components/field/field-screen";
import { MapScreen } from "@/components/field/screens/map";

export const metadata: Metadata = { title: "Map" };

export default function Page() {
  return (
    <FieldScreen
      gap="gap-3"
      head={
        <>
          <h1 className="text-2xl font-bold">Map</h1>
          <p className="text-ink-soft">The club&apos;s claims and your finds on the ground. Tap a find to open it; it works with no signal.</p>
        </>
      }
    >
      <MapScreen />
    </FieldScreen>
  );
}
