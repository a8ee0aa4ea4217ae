import { FieldShell } from "@/components/field/field-shell";

// Member screens are static shells: they open from the service worker's cache with no
// signal and read everything from this device's database.
export default function FieldLayout({ children }: { children: React.ReactNode }) {
  return <FieldShell>{children}</FieldShell>;
}
