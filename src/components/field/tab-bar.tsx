"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";

const TABS = [
  { href: "/", label: "Today" },
  { href: "/finds", label: "Finds" },
  { href: "/outings", label: "Outings" },
  { href: "/map", label: "Map" },
  { href: "/sync", label: "Sync" },
] as const;

/** Thumb-reach navigation for phones: one row at the bottom, big targets. */
export function TabBar() {
  const path = usePathname();
  return (
    <nav aria-label="Field" className="no-print fixed inset-x-0 bottom-0 z-20 border-t-2 border-rule bg-sheet md:hidden">
      <ul className="grid grid-cols-5">
        {TABS.map((t) => {
          const active = t.href === "/" ? path === "/" : path.startsWith(t.href);
          return (
            <li key={t.href}>
              <Link
                href={t.href}
                aria-current={active ? "page" : undefined}
                className={`flex min-h-[52px] items-center justify-center text-sm font-bold no-underline ${active ? "border-t-4 border-ochre text-ochre" : "text-ink"}`}
              >
                {t.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
