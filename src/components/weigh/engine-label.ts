import { ENGINE_VERSION } from "@/lib/estimate/version";

/** Dotted version numbers compared part by part: negative when a is older than b. */
export function compareVersions(a: string, b: string): number {
  const pa = a.split(".").map(Number);
  const pb = b.split(".").map(Number);
  for (let i = 0; i < Math.max(pa.length, pb.length); i++) {
    const d = (pa[i] ?? 0) - (pb[i] ?? 0);
    if (d !== 0) return Number.isNaN(d) ? 0 : d;
  }
  return 0;
}

/**
 * Which engine made a kept estimate, in words. A weigh-in keeps the estimate of the engine
 * that made it; one made by an older engine than this app's says so rather than pass as current.
 */
export function engineLabel(version: string): string {
  const c = compareVersions(version, ENGINE_VERSION);
  if (c < 0) return `made by the older engine ${version} (this app has ${ENGINE_VERSION})`;
  if (c > 0) return `made by engine ${version}, newer than this app's ${ENGINE_VERSION}`;
  return `engine ${version}`;
}
