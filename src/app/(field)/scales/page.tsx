import type { Metadata } from "next";
import { FieldScreen } from "@/components/field/field-screen";
import { ScalesScreen } from "@/components/field/screens/scales";

export const metadata: Metadata = { title: "Scales" };

export default function Page() {
  return (
    <FieldScreen
      head={
        <>
          <h1 className="text-2xl font-bold">Scales and setup checks</h1>
          <p className="text-ink-soft">
            A setup check weighs an object of known density on your rig. If the rig reads it true, a poor estimate is the specimen&apos;s, not a wet line, a
            bubble, a drifting scale or a basket touching the cup. Weigh-ins record the scale and its last check.
          </p>
        </>
      }
    >
      <ScalesScreen />
    </FieldScreen>
  );
}
