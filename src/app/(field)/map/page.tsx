import type { Metadata } from "next";
import { FieldScreen } from "@/components/field/field-screen";
import { MapScreen } from "@/components/field/screens/map";

export const metadata: Metadata = { title: "Map" };

export default function Page() {
  return (
    <FieldScreen>
      <MapScreen />
    </FieldScreen>
  );
}
