import type { Metadata } from "next";
import { FieldScreen } from "@/components/field/field-screen";
import { IntentLink } from "@/components/intent-link";
import { FindsListScreen } from "@/components/field/screens/finds-list";

export const metadata: Metadata = { title: "Finds" };

export default function Page() {
  return (
    <FieldScreen
      gap="gap-3"
      head={
        <div className="flex items-center justify-between">
          <h1 className="text-2xl font-bold">Your finds</h1>
          <IntentLink href="/finds/new" className="btn btn-primary">
            Log a find
          </IntentLink>
        </div>
      }
    >
      <FindsListScreen />
    </FieldScreen>
  );
}
