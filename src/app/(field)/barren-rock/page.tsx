import type { Metadata } from "next";
import { FieldScreen } from "@/components/field/field-screen";
import { MIN_PIECES } from "@/lib/figures/host-proposal";
import { BarrenRockScreen } from "@/components/field/screens/barren-rock";

export const metadata: Metadata = { title: "Barren rock" };

export default function Page() {
  return (
    <FieldScreen
      head={
        <>
          <h1 className="text-2xl font-bold">Barren rock</h1>
          <p className="text-ink-soft">
            Weigh {MIN_PIECES}–10 pieces of gold-free rock from the claim&apos;s vein. Their densities teach the club the claim&apos;s host rock, so specimen
            estimates there stop leaning on a preset.
          </p>
        </>
      }
    >
      <BarrenRockScreen />
    </FieldScreen>
  );
}
