import type { Metadata } from "next";
import { Suspense } from "react";
import { Skeleton } from "@/components/field/skeleton";
import { ScalesScreen } from "@/components/field/screens/scales";

export const metadata: Metadata = { title: "Scales" };

export default function Page() {
  return (
    <Suspense fallback={<Skeleton />}>
      <ScalesScreen />
    </Suspense>
  );
}
