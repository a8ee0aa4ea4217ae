import { IntentLink } from "../intent-link";
import { Skeleton } from "./skeleton";

/**
 * Home's first frame, in the page's own HTML: the greeting and the main action, drawn before
 * the member is known (the device's database opening, or a new device asking the server who
 * is signed in); a phone on camp signal sees the screen's shape at once instead of grey bars.
 * The field caution closes it, as it closes Today (app/(field)/page.tsx).
 */
export function HomeFrame({ caution }: { caution: React.ReactNode }) {
  return (
    <>
      <h1 className="text-2xl font-bold">Good day</h1>
      <IntentLink href="/finds/new" className="btn btn-primary min-h-[64px] text-xl">
        Log a find
      </IntentLink>
      <Skeleton lines={3} />
      {caution}
    </>
  );
}
