import type { Metadata } from "next";
import { FieldScreen } from "@/components/field/field-screen";
import { CampSyncScreen } from "@/components/field/screens/camp-sync";

export const metadata: Metadata = { title: "Camp sync" };

export default function Page() {
  return (
    <FieldScreen
      head={
        <>
          <h1 className="text-2xl font-bold">Camp sync</h1>
          <p className="text-ink-soft">
            Your finds, weigh-ins and photos wait on this device until it reaches the club&apos;s server. Camp sync sends them when there is signal and brings
            back the officers&apos; checks and the club&apos;s claims.
          </p>
        </>
      }
    >
      <CampSyncScreen />
    </FieldScreen>
  );
}
