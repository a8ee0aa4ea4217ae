import { describe, expect, it } from "vitest";
import { ENGINE_VERSION } from "@/lib/estimate/version";
import { compareVersions, engineLabel } from "./engine-label";

describe("which engine made a kept estimate", () => {
  it("shows an older weigh-in as made by the older engine", () => {
    expect(ENGINE_VERSION).toBe("2.1.0");
    expect(engineLabel("1.0.0")).toBe("made by the older engine 1.0.0 (this app has 2.1.0)");
    expect(engineLabel(ENGINE_VERSION)).toBe("engine 2.1.0");
    expect(engineLabel("2.2.0")).toMatch(/newer/);
  });
  it("compares versions by number, not as text", () => {
    expect(compareVersions("10.0.0", "9.0.0")).toBeGreaterThan(0);
    expect(compareVersions("2.0.0", "2.0")).toBe(0);
  });
});
