import { build } from "esbuild";
import type { Browser, Page } from "playwright-core";
import { PHOTO_SEND_EDGE, PHOTO_SEND_QUALITY } from "../src/lib/entities/constants";
import type { StudyRow } from "./photo-page";
import { report } from "./stats";

type PhotoPage = typeof import("./photo-page");

/** bench/photo-page.ts bundled for a page, as `lodebookBenchPhotos`. */
export async function addPhotoPage(page: Page): Promise<void> {
  const bundle = await build({
    entryPoints: ["bench/photo-page.ts"],
    bundle: true,
    format: "iife",
    globalName: "lodebookBenchPhotos",
    write: false,
    platform: "browser",
    tsconfig: "tsconfig.json",
    logLevel: "silent",
  });
  await page.addScriptTag({ content: bundle.outputFiles[0].text });
}

const EDGES = [1280, 1600, 2048];
const QUALITIES = [0.6, 0.7, 0.75, 0.8, 0.85];
const SEEDS = [11, 12, 13];

/**
 * The photo-size study: three painted 12 MP specimens, each shrunk at every long edge ×
 * quality, bytes against SSIM at phone size and zoomed 2×. Prints the table the README's
 * choice rests on, and checks the chosen pair against its goals.
 */
export async function photoStudy(browser: Browser, baseUrl: string) {
  const page = await (await browser.newContext()).newPage();
  await page.goto(`${baseUrl}/about`);
  await addPhotoPage(page);
  const pairs = EDGES.flatMap((e) => QUALITIES.map((q) => [e, q] as [number, number]));
  if (!pairs.some(([e, q]) => e === PHOTO_SEND_EDGE && q === PHOTO_SEND_QUALITY)) pairs.push([PHOTO_SEND_EDGE, PHOTO_SEND_QUALITY]);
  const all: StudyRow[][] = [];
  const originals: number[] = [];
  for (const seed of SEEDS) {
    const out = await page.evaluate(
      async ({ seed, pairs }) => {
        const lib = (window as unknown as { lodebookBenchPhotos: PhotoPage }).lodebookBenchPhotos;
        const original = await lib.cameraJpeg(seed);
        return { original: original.size, rows: await lib.studyOriginal(original, pairs) };
      },
      { seed, pairs },
    );
    originals.push(out.original);
    all.push(out.rows);
  }
  await page.context().close();
  const mean = (f: (r: StudyRow) => number, i: number) => all.reduce((n, rows) => n + f(rows[i]), 0) / all.length;
  console.log(
    `        photo study: ${SEEDS.length} painted 12 MP specimens (camera JPEGs of ${originals.map((b) => (b / 1024 / 1024).toFixed(1)).join(", ")} MB), mean of the three`,
  );
  console.log("        long edge  quality    kB   SSIM phone  SSIM zoomed 2×");
  pairs.forEach(([edge, quality], i) => {
    const mark = edge === PHOTO_SEND_EDGE && quality === PHOTO_SEND_QUALITY ? "  ← chosen" : "";
    console.log(
      `        ${String(edge).padStart(9)}  ${quality.toFixed(2).padStart(7)}  ${(mean((r) => r.bytes, i) / 1024).toFixed(0).padStart(4)}   ${mean((r) => r.ssimPhone, i).toFixed(4)}      ${mean((r) => r.ssimZoom, i).toFixed(4)}${mark}`,
    );
  });
  // The rule (README): a day's 60 photos must leave room for records, headers and round trips
  // in 120 s at 1 Mbit/s, so a photo gets ≤ 200 kB (60 × 200 kB ≈ 96 s); of the pairs under
  // that, the one that keeps the most detail zoomed in.
  const budget = 200 * 1024;
  const chosen = pairs.findIndex(([e, q]) => e === PHOTO_SEND_EDGE && q === PHOTO_SEND_QUALITY);
  const kb = all.map((rows) => rows[chosen].bytes / 1024);
  report(`photo sent at ${PHOTO_SEND_EDGE} px, quality ${PHOTO_SEND_QUALITY} (painted 12 MP specimens)`, {
    value: kb,
    unit: "kB",
    goal: "≤ 200 kB each",
    pass: Math.max(...kb) * 1024 <= budget,
  });
  const fits = pairs.map((_, i) => i).filter((i) => mean((r) => r.bytes, i) <= budget);
  const sharpest = fits.reduce((a, b) => (mean((r) => r.ssimZoom, b) > mean((r) => r.ssimZoom, a) ? b : a), fits[0] ?? chosen);
  const best = pairs.findIndex(([e, q]) => e === 2048 && q === 0.85);
  report(`photo detail zoomed 2× at ${PHOTO_SEND_EDGE} px, quality ${PHOTO_SEND_QUALITY}`, {
    value: all.map((rows) => rows[chosen].ssimZoom),
    unit: "SSIM",
    ratio: all.map((rows) => rows[chosen].ssimZoom / rows[best].ssimZoom),
    ratioLabel: "× 2048 px at 0.85",
    goal: `the sharpest under 200 kB (now ${pairs[sharpest][0]} px at ${pairs[sharpest][1]})`,
    pass: sharpest === chosen,
  });
}
