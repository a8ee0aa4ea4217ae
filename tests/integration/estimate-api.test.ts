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

  it("refuses unknown fields, non-JSON and text/plain bodies with 4xx, never 500", async () => {
    expect((await post({ method: "hanging", airGrams: [10], waterGrams: [6], owner: "x" })).status).toBe(400);
    expect((await post("{not json")).status).toBe(400);
    expect((await post(JSON.stringify({ method: "hanging" }), "text/plain")).status).toBe(415);
  });
});
