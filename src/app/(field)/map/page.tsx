import type { Metadata } from "next";
import { Suspense } from "react";
import { Skeleton } from "@/components/field/skeleton";
import { MapScreen } from "@/components/field/screens/map";

export const metadata: Metadata = { title: "Map" };

export default function Page() {
  return (
    <Suspense fallback={<Skeleton />}>
      <MapScreen />
    </Suspense>
  );
}
