import type { Metadata } from "next";
import { Suspense } from "react";
import { Skeleton } from "@/components/field/skeleton";
import { FindsListScreen } from "@/components/field/screens/finds-list";

export const metadata: Metadata = { title: "Finds" };

export default function Page() {
  return (
    <Suspense fallback={<Skeleton />}>
      <FindsListScreen />
    </Suspense>
  );
}
