/**
 * Bumped whenever a change could move any result; every stored estimate keeps the version
 * that made it. Its own module, so screens that only label a kept estimate do not load the engine.
 */
export const ENGINE_VERSION = "2.1.0";
