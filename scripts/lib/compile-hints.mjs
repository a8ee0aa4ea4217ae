// @ts-check

/**
 * V8's explicit compile hint (Chrome 136 and later): a file that opens with this comment has
 * every function compiled eagerly, on a background thread while the file streams in. Without
 * it V8 only pre-parses each function and compiles it on the main thread the first time it
 * is called, which on a page's start is nearly every function of React, Next's runtime, the
 * device database and the screen: a phone's first seconds were largely that compile work.
 * Other browsers read it as a comment.
 */
export const COMPILE_HINT = "//# allFunctionsCalledOnLoad\n";

// The parts of webpack this plugin touches (Next bundles webpack without its types).
/** @typedef {{ source(): string | Buffer }} Source */
/** @typedef {{ chunks: Iterable<{ files: Iterable<string> }> }} Entrypoint */
/**
 * @typedef {{
 *   entrypoints: Map<string, Entrypoint>;
 *   hooks: { processAssets: { tap(options: { name: string; stage: number }, run: (assets: Record<string, Source>) => void): void } };
 *   updateAsset(file: string, update: (source: Source) => Source): void;
 * }} Compilation
 */
/** @typedef {{ hooks: { thisCompilation: { tap(name: string, run: (compilation: Compilation) => void): void } } }} Compiler */
/**
 * @typedef {{
 *   Compilation: { PROCESS_ASSETS_STAGE_OPTIMIZE_SIZE: number };
 *   sources: { ConcatSource: new (...parts: (string | Source)[]) => Source; RawSource: new (text: string) => Source };
 * }} Webpack
 */

/**
 * The JavaScript files a page loads before it can answer a tap: every file of every entry
 * (Next's runtime, the app's frames and screens, and what they import statically). Files
 * loaded on demand (the map's MapLibre, dynamic imports) run only a part of their functions
 * and keep V8's lazy compile.
 * @param {Iterable<Entrypoint>} entrypoints
 * @returns {Set<string>}
 */
export function startFiles(entrypoints) {
  const files = new Set();
  for (const entry of entrypoints) for (const chunk of entry.chunks) for (const file of chunk.files) if (file.endsWith(".js")) files.add(file);
  return files;
}

/** Puts the compile hint at the top of every start file of a client build. */
export class CompileHintsPlugin {
  /** @param {Webpack} webpack the webpack Next hands to its config hook */
  constructor(webpack) {
    this.webpack = webpack;
  }

  /** @param {Compiler} compiler */
  apply(compiler) {
    const { Compilation, sources } = this.webpack;
    compiler.hooks.thisCompilation.tap("CompileHintsPlugin", (compilation) => {
      compilation.hooks.processAssets.tap(
        // After minifying (which would drop the comment), before source maps are written and
        // content hashes taken, so both count the added line.
        { name: "CompileHintsPlugin", stage: Compilation.PROCESS_ASSETS_STAGE_OPTIMIZE_SIZE + 1 },
        () => {
          for (const file of startFiles(compilation.entrypoints.values()))
            compilation.updateAsset(file, (source) => new sources.ConcatSource(COMPILE_HINT, source));
        },
      );
    });
  }
}
