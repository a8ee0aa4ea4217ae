/** What camp sync is doing now: one union, shown by one component. */
export type SyncStatus =
  | { kind: "idle"; waiting: number; rejected: number; lastSyncedAt: number | null }
  | { kind: "offline"; waiting: number; rejected: number; lastSyncedAt: number | null }
  /** Items done of total (changes, or photos in the "photos" phase), photo bytes, and the time left when known. */
  | {
      kind: "syncing";
      phase: "sending" | "photos" | "receiving";
      done: number;
      total: number;
      bytesDone: number;
      bytesTotal: number;
      secondsLeft?: number | null;
    }
  | { kind: "done"; at: number; sent: number; received: number; rejected: number }
  | { kind: "needs-sign-in"; waiting: number; reason: "expired" | "other-member" }
  | { kind: "outdated"; waiting: number }
  | { kind: "error"; message: string; retryAt: number; waiting: number };

type Listener = () => void;

/** A tiny external store, read with useSyncExternalStore. */
export function createStatusStore(initial: SyncStatus) {
  let status = initial;
  const listeners = new Set<Listener>();
  return {
    get: () => status,
    set(next: SyncStatus) {
      status = next;
      listeners.forEach((l) => l());
    },
    subscribe(listener: Listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
}

export type StatusStore = ReturnType<typeof createStatusStore>;

/** The device's one camp-sync status, set by the scheduler and read by the status component. */
export const syncStatus = createStatusStore({ kind: "idle", waiting: 0, rejected: 0, lastSyncedAt: null });
