import type { Metadata } from "next";
import { Suspense } from "react";
import { Skeleton } from "@/components/field/skeleton";
import { SettingsScreen } from "@/components/field/screens/settings";

export const metadata: Metadata = { title: "Settings" };

export default function Page() {
  return (
    <Suspense fallback={<Skeleton />}>
      <SettingsScreen />
    </Suspense>
  );
}
