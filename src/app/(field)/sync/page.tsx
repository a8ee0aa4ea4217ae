import type { Metadata } from "next";
import { Suspense } from "react";
import { Skeleton } from "@/components/field/skeleton";
import { CampSyncScreen } from "@/components/field/screens/camp-sync";

export const metadata: Metadata = { title: "Camp sync" };

export default function Page() {
  return (
    <Suspense fallback={<Skeleton />}>
      <CampSyncScreen />
    </Suspense>
  );
}
