import type { Metadata } from "next";
import { Suspense } from "react";
import { Skeleton } from "@/components/field/skeleton";
import { OutingDetailScreen } from "@/components/field/screens/outing-detail";

export const metadata: Metadata = { title: "Outing" };

export default function Page() {
  return (
    <Suspense fallback={<Skeleton />}>
      <OutingDetailScreen />
    </Suspense>
  );
}
