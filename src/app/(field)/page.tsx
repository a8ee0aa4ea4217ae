import type { Metadata } from "next";
import { Suspense } from "react";
import { Skeleton } from "@/components/field/skeleton";
import { TodayScreen } from "@/components/field/screens/today";

export const metadata: Metadata = { title: "Today" };

export default function Page() {
  return (
    <Suspense fallback={<Skeleton />}>
      <TodayScreen />
    </Suspense>
  );
}
