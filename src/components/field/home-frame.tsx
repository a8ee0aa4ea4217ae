import { IntentLink } from "../intent-link";
import { HeadOutCaution } from "./head-out-caution";
import { Skeleton } from "./skeleton";

/**
 * Home's first frame, in the page's own HTML: the greeting, the main action and the field
 * caution, drawn before the member is known (the device's database opening, or a new device
 * asking the server who is signed in). The caution is the screen's largest text and Today
 * shows it at the same size, so the first paint is the largest one; a phone on camp signal
 * sees the screen's shape at once instead of grey bars.
 */
export function HomeFrame() {
  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-2xl font-bold">Good day</h1>
      <IntentLink href="/finds/new" className="btn btn-primary min-h-[64px] text-xl">
        Log a find
      </IntentLink>
      <Skeleton lines={3} />
      <HeadOutCaution />
    </div>
  );
}
