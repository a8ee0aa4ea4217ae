import type { SyncStatus } from "@/client/sync/status";

export function formatBytes(n: number): string {
  return n < 1024 * 1024 ? `${Math.max(1, Math.round(n / 1024))} kB` : `${(n / 1024 / 1024).toFixed(1)} MB`;
}

function formatSeconds(s: number): string {
  if (s < 60) return `${Math.max(1, s)} s`;
  const min = Math.floor(s / 60);
  return min < 10 ? `${min} min ${s % 60} s` : `${Math.round(s / 60)} min`;
}

/** What camp sync is doing, in items, bytes and time left. */
export function progressWords(status: Extract<SyncStatus, { kind: "syncing" }>): string {
  if (status.phase === "photos") {
    const left = status.secondsLeft == null ? "" : ` · about ${formatSeconds(status.secondsLeft)} left`;
    return `Sending photos: ${status.done} of ${status.total} · ${formatBytes(status.bytesDone)} of ${formatBytes(status.bytesTotal)}${left}`;
  }
  const phase = status.phase === "sending" ? "Sending changes" : "Receiving from the club";
  return `${phase}: ${status.done} of ${Math.max(status.total, status.done)}`;
}
