import type { Metadata } from "next";
import { WeighInFlow } from "@/components/weigh/weigh-in-flow";

export const metadata: Metadata = { title: "Weigh a specimen" };

/** Open to anyone, with or without an account: the arithmetic runs on this device. */
export default function WeighPage() {
  return (
    <div className="flex flex-col gap-4">
      <header>
        <h1 className="text-2xl font-bold">Weigh a specimen</h1>
        <p className="text-ink-soft">
          Gold in quartz from two weighings: once dry in air, once hung in water. The estimate works on this device, with no signal.
        </p>
      </header>
      <WeighInFlow />
    </div>
  );
}
