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

  it("words every refused value itself, per field, never in zod's default English", async () => {
    const base = { method: "hanging", airGrams: [30], waterGrams: [19.6] };
    const bad: [string, unknown][] = [
      ["scaleResolutionGrams", 20],
      ["scaleResolutionGrams", "0.01"],
      ["scaleAccuracyGrams", 11],
      ["scaleAccuracyGrams", -1],
      ["waterTempC", 41],
      ["waterTempToleranceC", 25],
      ["waterTempToleranceC", -1],
      ["hostDensityRange", [2.6, 30]],
      ["hostDensityRange", [2.6]],
      ["finenessRangePermille", [-5, 900]],
      ["finenessPermille", "850"],
      ["goldDensity", 0.5],
      ["airBuoyancyCorrection", "false"],
      ["airGrams", "30"],
      ["airGrams", ["30"]],
      ["owner", "x"],
    ];
    for (const [field, value] of bad) {
      const res = await post({ ...base, [field]: value });
      expect(res.status, `${field}: ${JSON.stringify(value)}`).toBe(400);
      const messages: string[] = Object.values((await res.json()).error.fields as Record<string, string[]>).flat();
      expect(messages.length, field).toBeGreaterThan(0);
      for (const m of messages) expect(m, `${field}: ${JSON.stringify(value)}`).not.toMatch(/expected|received|Invalid input|Too (big|small)/i);
    }
  });

  it("names an unknown field, and asks for an object when sent anything else", async () => {
    const res = await post({ method: "hanging", airGrams: [30], waterGrams: [19.6], "own\u202eer": 1 });
    const messages = Object.values((await res.json()).error.fields as Record<string, string[]>).flat();
    expect(messages.join()).toContain('Field "own?er" not known here');
    for (const body of [null, [1, 2], 5]) {
      const answer = await post(body);
      expect(answer.status).toBe(400);
      expect(JSON.stringify((await answer.json()).error)).toContain("as an object of named fields");
    }
  });

  it("holds a specimen denser than the finest gold allowed at that gold, with the warning", async () => {
    // About 19.0 g/cm³ against natural gold of 700–950 ‰ (950 ‰ is 18.54 g/cm³).
    const res = await post({ method: "hanging", airGrams: [100], waterGrams: [94.753], finenessPermille: 825, finenessRangePermille: [700, 950] });
    expect(res.status).toBe(200);
    const { estimate } = await res.json();
    expect(estimate.assumptions.finenessRangePermille).toEqual([950, 950]);
    expect(estimate.warnings.map((w: { code: string }) => w.code)).toContain("denser_than_alloy");
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
