import type { Config } from "tailwindcss";

// Theme tokens. Colours resolve to CSS variables set in globals.css for the daylight
// (paper) and camp-evening (dark) themes, so every utility follows the theme.
export default {
  content: ["./src/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: "var(--paper)",
        sheet: "var(--sheet)",
        ink: "var(--ink)",
        "ink-soft": "var(--ink-soft)",
        rule: "var(--rule)",
        edge: "var(--edge)",
        ochre: "var(--ochre)",
        "ochre-ink": "var(--ochre-ink)",
        moss: "var(--moss)",
        rust: "var(--rust)",
        caution: "var(--caution)",
      },
      fontFamily: {
        sans: ["var(--font-atkinson-extended)", "var(--font-atkinson)", "system-ui", "sans-serif"],
        mono: ["ui-monospace", "SFMono-Regular", "Menlo", "monospace"],
      },
      minHeight: { touch: "44px" },
      minWidth: { touch: "44px" },
    },
  },
} satisfies Config;
