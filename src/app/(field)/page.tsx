import type { Metadata } from "next";
import { Suspense } from "react";
import { HeadOutCaution } from "@/components/field/head-out-caution";
import { HomeFrame } from "@/components/field/home-frame";
import { MemberGate } from "@/components/field/member-gate";
import { Skeleton } from "@/components/field/skeleton";
import { TodayScreen } from "@/components/field/screens/today";

export const metadata: Metadata = { title: "Today" };

export default function Page() {
  return (
    <div className="flex flex-col gap-5">
      <MemberGate fallback={<HomeFrame />}>
        <Suspense fallback={<Skeleton />}>
          <TodayScreen />
        </Suspense>
      </MemberGate>
      {/* The screen's largest text, in the HTML and never drawn again: the first paint is the
          largest one, and Today's script does not carry these words. */}
      <HeadOutCaution />
    </div>
  );
}
