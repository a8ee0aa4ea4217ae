import { describe, expect, it } from "vitest";
import { secondsLeft } from "@/client/sync/engine";
import { formatBytes, photoBytesWords } from "./progress-words";

describe("camp sync's progress in plain words", () => {
  it("says bytes sent of the total and the time left at the rate seen so far", () => {
    const status = { kind: "syncing" as const, phase: "photos" as const, done: 12, total: 60, bytesDone: 2.5 * 1024 * 1024, bytesTotal: 11.6 * 1024 * 1024 };
    expect(photoBytesWords({ ...status, secondsLeft: 83 })).toBe("2.5 MB of 11.6 MB sent · about 1 min 23 s left");
    expect(photoBytesWords({ ...status, secondsLeft: null })).toBe("2.5 MB of 11.6 MB sent · working out the time left");
    expect(photoBytesWords({ ...status, secondsLeft: 725 })).toMatch(/about 12 min left$/);
    expect(formatBytes(0)).toBe("0 kB");
    expect(formatBytes(300)).toBe("1 kB");
  });

  it("estimates the time left only once a couple of seconds and some bytes have gone", () => {
    expect(secondsLeft(0, 1000, 10_000)).toBeNull();
    expect(secondsLeft(500, 1000, 1000)).toBeNull();
    // 1 MB in 8 s: 10 MB more take 80 s.
    expect(secondsLeft(1_000_000, 11_000_000, 8000)).toBe(80);
    expect(secondsLeft(1000, 1000, 5000)).toBe(0);
  });
});
