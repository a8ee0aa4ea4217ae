"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import type { ComponentProps } from "react";

type Props = Omit<ComponentProps<typeof Link>, "prefetch" | "href"> & { href: string };

/**
 * A link to another screen that fetches it when the member reaches for it (a finger or pointer
 * on it, keyboard focus), not when it scrolls into view. Next prefetches every visible link
 * by default: on a phone's first load that was five screens' payloads decoded while the
 * first screen and its camp sync still needed the main thread. A finger on the glass comes a
 * tenth of a second or more before the tap lands, which is most of a payload on camp signal;
 * with no signal the service worker's copy of each screen opens it either way.
 */
export function IntentLink({ href, onPointerEnter, onTouchStart, onFocus, ...props }: Props) {
  const router = useRouter();
  const warm = () => {
    if (href.startsWith("/")) router.prefetch(href);
  };
  return (
    <Link
      href={href}
      prefetch={false}
      onPointerEnter={(e) => {
        warm();
        onPointerEnter?.(e);
      }}
      onTouchStart={(e) => {
        warm();
        onTouchStart?.(e);
      }}
      onFocus={(e) => {
        warm();
        onFocus?.(e);
      }}
      {...props}
    />
  );
}
