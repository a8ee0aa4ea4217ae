import type { Metadata } from "next";
import { Suspense } from "react";
import { Skeleton } from "@/components/field/skeleton";
import { OutingsScreen } from "@/components/field/screens/outings-list";

export const metadata: Metadata = { title: "Outings" };

export default function Page() {
  return (
    <Suspense fallback={<Skeleton />}>
      <OutingsScreen />
    </Suspense>
  );
}
