import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { createRequire } from "node:module";
import { afterAll, describe, expect, it } from "vitest";
import { COMPILE_HINT, CompileHintsPlugin, type Compiler, type Webpack } from "../../scripts/lib/compile-hints.mjs";

// The compile hint goes on the files a page runs at start and on no file loaded on demand, and
// survives minifying. Built here with the webpack Next bundles (the one its config hook hands
// over), on a small app of two entries, a shared module and a dynamic import.
const require = createRequire(import.meta.url);
type Build = { run(done: (error: Error | null, stats?: { hasErrors(): boolean; toString(): string }) => void): void; close(done: () => void): void };
const { webpack } = require("next/dist/compiled/webpack/webpack") as { webpack: Webpack & ((options: object) => Build) };

/**
 * A stand-in for Next's minifier (which needs the whole of `next build` around it): at the
 * same stage, it drops every comment line, as a minifier drops comments. The browser test
 * (phone.test.ts) checks the real build's files.
 */
const dropComments = {
  apply(compiler: Compiler) {
    compiler.hooks.thisCompilation.tap("drop-comments", (compilation) =>
      compilation.hooks.processAssets.tap({ name: "drop-comments", stage: webpack.Compilation.PROCESS_ASSETS_STAGE_OPTIMIZE_SIZE }, (assets) => {
        for (const file of Object.keys(assets).filter((f) => f.endsWith(".js")))
          compilation.updateAsset(file, (source) => new webpack.sources.RawSource(String(source.source()).replace(/^\s*\/\/.*$/gm, "")));
      }),
    );
  },
};

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-hints-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function write(name: string, text: string) {
  fs.writeFileSync(path.join(dir, name), text);
}

async function build(devtool: false | "source-map", hints = true): Promise<Record<string, string>> {
  write("shared.js", "export function shared(n) { return n * 2; }\n");
  write(
    "screen.js",
    'import { shared } from "./shared.js";\nexport function draw() { return import("./later.js").then((m) => m.later(shared(1))); }\ndraw();\n',
  );
  write("frame.js", 'import { shared } from "./shared.js";\nconsole.log(shared(3));\n');
  write("later.js", "export function later(n) { return n + 1; }\n");
  const out = path.join(dir, `out-${devtool}-${hints}`);
  const compiler = webpack({
    mode: "production",
    context: dir,
    devtool,
    entry: { screen: "./screen.js", frame: "./frame.js" },
    output: { path: out, filename: "[name]-[contenthash].js", chunkFilename: "[name]-[contenthash].chunk.js" },
    // With source maps, no stand-in minifier (it keeps none): the map alone is checked there.
    optimization: {
      minimizer: devtool ? [] : [dropComments],
      splitChunks: { chunks: "all", minSize: 0, cacheGroups: { shared: { test: /shared/, name: "shared", enforce: true } } },
    },
    plugins: hints ? [new CompileHintsPlugin(webpack)] : [],
  });
  await new Promise<void>((resolve, reject) =>
    compiler.run((error, stats) => (error || stats?.hasErrors() ? reject(error ?? new Error(stats?.toString())) : compiler.close(() => resolve()))),
  );
  return Object.fromEntries(fs.readdirSync(out).map((f) => [f, fs.readFileSync(path.join(out, f), "utf8")]));
}

describe("V8's compile hint on the files a page starts with", () => {
  it("opens every entry file and every file an entry shares, and no file loaded on demand", async () => {
    const files = await build(false);
    const scripts = Object.keys(files).filter((f) => f.endsWith(".js"));
    const onDemand = scripts.filter((f) => files[f].includes("function later"));
    const atStart = scripts.filter((f) => !onDemand.includes(f));
    expect(onDemand).toHaveLength(1);
    expect(atStart.map((f) => f.split("-")[0]).sort()).toEqual(["frame", "screen", "shared"]);
    for (const f of atStart) expect(files[f].startsWith(COMPILE_HINT), f).toBe(true);
    expect(files[onDemand[0]]).not.toContain("allFunctionsCalledOnLoad");
    // Added after the minifier, which drops comments: a hint put in before it would be gone.
  });

  it("counts the added line in the source map: every mapping one line down, so a mapped position still lands on its source line", async () => {
    const mapOf = (files: Record<string, string>) =>
      (JSON.parse(files[Object.keys(files).find((f) => f.startsWith("shared") && f.endsWith(".js.map"))!]) as { mappings: string }).mappings;
    const [hinted, plain] = await Promise.all([build("source-map"), build("source-map", false)]);
    expect(mapOf(hinted)).toBe(`;${mapOf(plain)}`);
  });
});
