import type { Metadata } from "next";
import { FieldScreen } from "@/components/field/field-screen";
import { FindDetailScreen } from "@/components/field/screens/find-detail";

export const metadata: Metadata = { title: "Find" };

export default function Page() {
  return (
    <FieldScreen>
      <FindDetailScreen />
    </FieldScreen>
  );
}
