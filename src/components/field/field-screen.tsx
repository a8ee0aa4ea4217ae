import { Suspense } from "react";
import { MemberGate } from "./member-gate";
import { Skeleton } from "./skeleton";

/**
 * A member screen: its static head, drawn from the HTML before any script runs, and its body,
 * drawn from this device's database once the member is known. The body's top-level elements
 * sit in the same column as the head (a screen returns them in a fragment).
 */
export function FieldScreen({ head, gap = "gap-4", children }: { head?: React.ReactNode; gap?: "gap-3" | "gap-4"; children: React.ReactNode }) {
  return (
    <div className={`flex flex-col ${gap}`}>
      {head}
      <MemberGate>
        <Suspense fallback={<Skeleton />}>{children}</Suspense>
      </MemberGate>
    </div>
  );
}
