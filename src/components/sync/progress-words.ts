import type { SyncStatus } from "@/client/sync/status";

export function formatBytes(n: number): string {
  return n < 1024 * 1024 ? `${n > 0 ? Math.max(1, Math.round(n / 1024)) : 0} kB` : `${(n / 1024 / 1024).toFixed(1)} MB`;
}

function formatSeconds(s: number): string {
  if (s < 60) return `${Math.max(1, s)} s`;
  const min = Math.floor(s / 60);
  return min < 10 ? `${min} min ${s % 60} s` : `${Math.round(s / 60)} min`;
}

/** The photos' part of camp sync in bytes and time left, beside the items the status line counts. */
export function photoBytesWords(status: Extract<SyncStatus, { kind: "syncing" }>): string {
  const left = status.secondsLeft == null ? "working out the time left" : `about ${formatSeconds(status.secondsLeft)} left`;
  return `${formatBytes(status.bytesDone)} of ${formatBytes(status.bytesTotal)} sent · ${left}`;
}
