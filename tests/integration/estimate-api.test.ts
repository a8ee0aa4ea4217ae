import { describe, expect, it } from "vitest";
import { POST } from "@/app/api/estimate/route";
import { estimateSpecimen } from "@/lib/estimate";
import { IDENTITY_VECTORS } from "@/lib/estimate/vectors";
import { req } from "../support/test-db";

const post = (body: unknown, type = "application/json") =>
  POST(req("/api/estimate", { method: "POST", body: typeof body === "string" ? body : JSON.stringify(body), headers: { "content-type": type } }), {} as never);

describe("POST /api/estimate", () => {
  it("answers with the engine's own numbers for every identity vector", async () => {
    for (const input of IDENTITY_VECTORS) {
      const res = await post(input);
      expect(res.status).toBe(200);
      // JSON carries doubles exactly (shortest round-trip form), so equality here is bit equality.
      expect((await res.json()).estimate).toEqual(estimateSpecimen(input));
    }
  });

  it("names the field for bad input", async () => {
    const res = await post({ method: "hanging", airGrams: [], waterGrams: [5] });
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.error.code).toBe("bad_request:estimate");
    expect(Object.keys(body.error.fields)).toContain("airGrams");
  });

  it("passes the engine's own input errors on as 400 with the field", async () => {
    const res = await post({ method: "hanging", airGrams: [100], waterGrams: [95] });
    expect(res.status).toBe(400);
    expect((await res.json()).error).toMatchObject({ fields: { waterGrams: [expect.stringMatching(/denser than pure gold/)] } });
  });

  it("refuses a 1e30 g reading, naming the field", async () => {
    const res = await post({ method: "hanging", airGrams: [1e30], waterGrams: [5] });
    expect(res.status).toBe(400);
    expect(Object.keys((await res.json()).error.fields).join()).toMatch(/airGrams/);
  });

  it("separates gold from a host denser than 10 g/cm³ (the silver of a gold-silver crown)", async () => {
    // 800 g of gold (19.32, CRC Handbook) with 200 g of silver (10.49–10.50, CRC Handbook [memory]), volumes adding, 20 °C.
    const res = await post({
      method: "hanging",
      airGrams: [1000],
      waterGrams: [939.64],
      hostDensity: 10.495,
      hostDensityRange: [10.49, 10.5],
      finenessPermille: 1000,
    });
    expect(res.status).toBe(200);
    const { estimate } = await res.json();
    expect(estimate.goldAlloyGrams).toBeGreaterThan(780);
    expect(estimate.goldAlloyGrams).toBeLessThan(820);
    for (const w of estimate.warnings) expect(Object.keys(w).sort()).toEqual(["code", "params"]);
  });

  it("refuses unknown fields, non-JSON and text/plain bodies with 4xx, never 500", async () => {
    expect((await post({ method: "hanging", airGrams: [10], waterGrams: [6], owner: "x" })).status).toBe(400);
    expect((await post("{not json")).status).toBe(400);
    expect((await post(JSON.stringify({ method: "hanging" }), "text/plain")).status).toBe(415);
  });
});
