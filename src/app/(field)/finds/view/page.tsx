import type { Metadata } from "next";
import { Suspense } from "react";
import { Skeleton } from "@/components/field/skeleton";
import { FindDetailScreen } from "@/components/field/screens/find-detail";

export const metadata: Metadata = { title: "Find" };

export default function Page() {
  return (
    <Suspense fallback={<Skeleton />}>
      <FindDetailScreen />
    </Suspense>
  );
}
