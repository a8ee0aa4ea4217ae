import type { Metadata } from "next";
import { FieldScreen } from "@/components/field/field-screen";
import { QuickFindScreen } from "@/components/field/screens/quick-find";

export const metadata: Metadata = { title: "Log a find" };

export default function Page() {
  return (
    <FieldScreen
      gap="gap-3"
      head={
        <>
          <h1 className="text-2xl font-bold">Log a find</h1>
          <p className="text-ink-soft">Tap what you found and save. The spot comes from the phone; photos and the weigh-in can follow at camp.</p>
        </>
      }
    >
      <QuickFindScreen />
    </FieldScreen>
  );
}
