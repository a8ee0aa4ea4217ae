import type { Metadata } from "next";
import { Suspense } from "react";
import { Skeleton } from "@/components/field/skeleton";
import { QuickFindScreen } from "@/components/field/screens/quick-find";

export const metadata: Metadata = { title: "Log a find" };

export default function Page() {
  return (
    <Suspense fallback={<Skeleton />}>
      <QuickFindScreen />
    </Suspense>
  );
}
