"use client";
import { useSyncExternalStore } from "react";

type Theme = "light" | "dark";
const KEY = "lodebook-theme";

function readTheme(): Theme {
  const set = document.documentElement.dataset.theme;
  if (set === "light" || set === "dark") return set;
  return window.matchMedia("(prefers-color-scheme: dark)").matches ? "dark" : "light";
}

const listeners = new Set<() => void>();
const subscribe = (fn: () => void) => {
  listeners.add(fn);
  return () => listeners.delete(fn);
};

/** Daylight or camp-evening theme, remembered on this device. */
export function ThemeToggle() {
  const theme = useSyncExternalStore(subscribe, readTheme, () => "light" as Theme);
  const next: Theme = theme === "dark" ? "light" : "dark";
  return (
    <button
      type="button"
      className="btn px-3"
      aria-label={next === "dark" ? "Switch to the evening theme" : "Switch to the daylight theme"}
      onClick={() => {
        document.documentElement.dataset.theme = next;
        localStorage.setItem(KEY, next);
        listeners.forEach((fn) => fn());
      }}
    >
      {next === "dark" ? "Evening" : "Daylight"}
    </button>
  );
}
