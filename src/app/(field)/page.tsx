import type { Metadata } from "next";
import { Suspense } from "react";
import { HomeFrame } from "@/components/field/home-frame";
import { MemberGate } from "@/components/field/member-gate";
import { Skeleton } from "@/components/field/skeleton";
import { TodayScreen } from "@/components/field/screens/today";

export const metadata: Metadata = { title: "Today" };

export default function Page() {
  return (
    <MemberGate fallback={<HomeFrame />}>
      <Suspense fallback={<Skeleton />}>
        <TodayScreen />
      </Suspense>
    </MemberGate>
  );
}
