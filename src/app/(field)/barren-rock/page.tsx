import type { Metadata } from "next";
import { Suspense } from "react";
import { Skeleton } from "@/components/field/skeleton";
import { BarrenRockScreen } from "@/components/field/screens/barren-rock";

export const metadata: Metadata = { title: "Barren rock" };

export default function Page() {
  return (
    <Suspense fallback={<Skeleton />}>
      <BarrenRockScreen />
    </Suspense>
  );
}
