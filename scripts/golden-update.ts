// npm run golden:update — write the engine's results for the generated inputs to
// src/lib/estimate/golden.json under the current ENGINE_VERSION. Results that move while the
// version stays are refused unless `-- --same-version` says that is meant (DEVELOPERS.md:
// bump ENGINE_VERSION for any change that can move a result).
import fs from "node:fs";
import path from "node:path";
import { goldenFileText, type GoldenFile } from "../src/lib/estimate/golden-inputs";
import { ENGINE_VERSION } from "../src/lib/estimate/version";

const file = path.resolve(import.meta.dirname, "../src/lib/estimate/golden.json");
const kept = JSON.parse(fs.readFileSync(file, "utf8")) as GoldenFile;
const text = goldenFileText(kept.count, kept.seed);
const next = JSON.parse(text) as GoldenFile;

if (JSON.stringify(next.results) === JSON.stringify(kept.results) && kept.engineVersion === ENGINE_VERSION) {
  console.log(`golden.json already holds engine ${ENGINE_VERSION}'s results; nothing to write.`);
} else if (kept.engineVersion === ENGINE_VERSION && !process.argv.includes("--same-version")) {
  const moved = next.results.filter((r, i) => JSON.stringify(r) !== JSON.stringify(kept.results[i])).length;
  console.error(
    `${moved} of ${kept.count} results moved while ENGINE_VERSION is still ${ENGINE_VERSION}. Bump it in src/lib/estimate/version.ts, or pass -- --same-version if the kept results were wrong.`,
  );
  process.exit(1);
} else {
  fs.writeFileSync(file, text);
  console.log(`golden.json: ${kept.count} results of engine ${ENGINE_VERSION} (were ${kept.engineVersion}).`);
}
