import path from "node:path";
import { build } from "esbuild";

/**
 * The estimate engine's own source bundled as one script that sets `lodebookEngine` on the
 * page it is evaluated in. Tests and the bench run it in Chromium to compare its doubles with
 * Node's; the app itself leaves nothing on `globalThis`.
 */
export async function engineScript(): Promise<string> {
  const result = await build({
    entryPoints: [path.resolve(import.meta.dirname, "../../src/lib/estimate/index.ts")],
    bundle: true,
    write: false,
    format: "iife",
    globalName: "lodebookEngine",
    platform: "browser",
    target: "es2022",
    minify: true,
    // Evaluated through the test driver the script's own `var` stays local: put it on the page.
    footer: { js: "globalThis.lodebookEngine = lodebookEngine;" },
  });
  return result.outputFiles[0].text;
}
