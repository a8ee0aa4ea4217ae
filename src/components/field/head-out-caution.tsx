import { Caution } from "@/components/caution";

/** The field caution on the member's home, closing Today and its first frame alike: drawn on the server (page.tsx). */
export function HeadOutCaution() {
  return (
    <Caution title="Before you head out">
      Tell someone where you are going and when you will be back. Stay out of old mine workings, watch dry washes for flash floods, and carry water. Claim rules
      differ by place and land agency: your club officer and the local authority have the last word.
    </Caution>
  );
}
