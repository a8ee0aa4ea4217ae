import type { Metadata } from "next";
import { FieldScreen } from "@/components/field/field-screen";
import { OutingDetailScreen } from "@/components/field/screens/outing-detail";

export const metadata: Metadata = { title: "Outing" };

export default function Page() {
  return (
    <FieldScreen>
      <OutingDetailScreen />
    </FieldScreen>
  );
}
