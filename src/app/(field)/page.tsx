import type { Metadata } from "next";
import { Suspense } from "react";
import { HeadOutCaution } from "@/components/field/head-out-caution";
import { HomeFrame } from "@/components/field/home-frame";
import { MemberGate } from "@/components/field/member-gate";
import { Skeleton } from "@/components/field/skeleton";
import { TodayScreen } from "@/components/field/screens/today";

export const metadata: Metadata = { title: "Today" };

export default function Page() {
  const caution = <HeadOutCaution />;
  return (
    <div className="flex flex-col gap-5">
      {/* The field caution, the screen's largest text, closes both the frame and Today at the
          same size (the first paint is the largest one). It is drawn here on the server and
          handed to Today, so Today's script does not carry its words; drawn anew under Today
          rather than kept below the gate, where Today arriving above it would move it. */}
      <MemberGate fallback={<HomeFrame caution={caution} />}>
        <Suspense fallback={<Skeleton />}>
          <TodayScreen caution={caution} />
        </Suspense>
      </MemberGate>
    </div>
  );
}
