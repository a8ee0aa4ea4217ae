import type { Metadata } from "next";
import { FieldScreen } from "@/components/field/field-screen";
import { SettingsScreen } from "@/components/field/screens/settings";

export const metadata: Metadata = { title: "Settings" };

export default function Page() {
  return (
    <FieldScreen
      head={
        <>
          <h1 className="text-2xl font-bold">Settings</h1>
          <p className="text-ink-soft">
            How this device shows weights and temperatures, your scale&apos;s step, what the club sees of where you found things, and the room your logbook
            takes here.
          </p>
        </>
      }
    >
      <SettingsScreen />
    </FieldScreen>
  );
}
