import localFont from "next/font/local";

// Atkinson Hyperlegible, shipped with the app (@fontsource's files). Through next/font the
// Latin files are preloaded and a metric-matched fallback stands in until they arrive, so the
// page does not reflow when the font swaps in (a console screen's header moved by 40 px).

/** Latin: every screen's text; preloaded. */
export const atkinson = localFont({
  src: [
    { path: "../../node_modules/@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "../../node_modules/@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-700-normal.woff2", weight: "700", style: "normal" },
  ],
  variable: "--font-atkinson",
  display: "swap",
});

/** Latin Extended (names such as Łucja or Đorđe): loaded only when a page uses those letters. */
export const atkinsonExtended = localFont({
  src: [
    { path: "../../node_modules/@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-ext-400-normal.woff2", weight: "400", style: "normal" },
    { path: "../../node_modules/@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-ext-700-normal.woff2", weight: "700", style: "normal" },
  ],
  variable: "--font-atkinson-extended",
  display: "swap",
  preload: false,
  adjustFontFallback: false,
  declarations: [
    {
      prop: "unicode-range",
      value:
        "U+0100-02BA,U+02BD-02C5,U+02C7-02CC,U+02CE-02D7,U+02DD-02FF,U+0304,U+0308,U+0329,U+1D00-1DBF,U+1E00-1E9F,U+1EF2-1EFF,U+2020,U+20A0-20AB,U+20AD-20C0,U+2113,U+2C60-2C7F,U+A720-A7FF",
    },
  ],
});
