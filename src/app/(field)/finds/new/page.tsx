import type { Metadata } from "next";
import { FieldScreen } from "@/components/field/field-screen";
import { QuickFindScreen } from "@/components/field/screens/quick-find";

export const metadata: Metadata = { title: "Log a find" };

export default function Page() {
  return (
    <FieldScreen>
      <QuickFindScreen />
    </FieldScreen>
  );
}
