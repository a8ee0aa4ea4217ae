import type { Metadata } from "next";
import { FieldScreen } from "@/components/field/field-screen";
import { IntentLink } from "@/components/intent-link";
import { OutingsScreen } from "@/components/field/screens/outings-list";

export const metadata: Metadata = { title: "Outings" };

export default function Page() {
  return (
    <FieldScreen
      gap="gap-3"
      head={
        <>
          <div className="flex items-center justify-between gap-2">
            <h1 className="text-2xl font-bold">Outings</h1>
            <IntentLink href="/" className="btn">
              Start one from Today
            </IntentLink>
          </div>
          <p className="text-ink-soft">
            An outing is a day&apos;s work on a claim: where, by what method, and what it turned up. A find logged while one is under way belongs to it.
          </p>
        </>
      }
    >
      <OutingsScreen />
    </FieldScreen>
  );
}
