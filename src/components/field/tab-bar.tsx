"use client";
import { IntentLink } from "@/components/intent-link";
import { usePathname } from "next/navigation";
import { useState } from "react";

const TABS = [
  { href: "/", label: "Today" },
  { href: "/finds", label: "Finds" },
  { href: "/outings", label: "Outings" },
  { href: "/map", label: "Map" },
  { href: "/sync", label: "Sync" },
] as const;

/** Every other member screen, one tap from the tab bar. */
export const MORE_SCREENS = [
  { href: "/weigh", label: "Weigh a specimen" },
  { href: "/scales", label: "Scales and setup checks" },
  { href: "/barren-rock", label: "Barren rock" },
  { href: "/settings", label: "Settings" },
  { href: "/about", label: "About and cautions" },
] as const;

const tabClass = (active: boolean) =>
  `flex min-h-[52px] w-full items-center justify-center text-sm font-bold no-underline ${active ? "border-t-4 border-ochre text-ochre" : "text-ink"}`;

/** Thumb-reach navigation for phones: one row at the bottom, big targets, and "More" for the rest. */
export function TabBar() {
  const path = usePathname();
  const [open, setOpen] = useState(false);
  const inMore = MORE_SCREENS.some((s) => path.startsWith(s.href));
  return (
    <nav aria-label="Field" className="no-print fixed inset-x-0 bottom-0 z-20 border-t-2 border-rule bg-sheet md:hidden">
      {open && (
        <ul id="more-screens" className="border-b-2 border-rule">
          {MORE_SCREENS.map((s) => (
            <li key={s.href}>
              <IntentLink
                href={s.href}
                onClick={() => setOpen(false)}
                aria-current={path.startsWith(s.href) ? "page" : undefined}
                className="flex min-h-[52px] items-center px-4 font-bold no-underline"
              >
                {s.label}
              </IntentLink>
            </li>
          ))}
        </ul>
      )}
      <ul className="grid grid-cols-6">
        {TABS.map((t) => {
          const active = t.href === "/" ? path === "/" : path.startsWith(t.href);
          return (
            <li key={t.href}>
              <IntentLink href={t.href} aria-current={active ? "page" : undefined} className={tabClass(active)} onClick={() => setOpen(false)}>
                {t.label}
              </IntentLink>
            </li>
          );
        })}
        <li>
          <button type="button" className={tabClass(inMore || open)} aria-expanded={open} aria-controls="more-screens" onClick={() => setOpen(!open)}>
            More
          </button>
        </li>
      </ul>
    </nav>
  );
}
