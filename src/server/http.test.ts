import { describe, expect, it } from "vitest";
import { jsonTooDeep, MAX_JSON_DEPTH } from "./http";

const nested = (depth: number, inner = "1") => "[".repeat(depth) + inner + "]".repeat(depth);

describe("how deep a request's JSON may nest (jsonTooDeep)", () => {
  it("lets through the limit itself and refuses one level more", () => {
    expect(jsonTooDeep(nested(MAX_JSON_DEPTH))).toBeNull();
    expect(jsonTooDeep(nested(MAX_JSON_DEPTH + 1))).not.toBeNull();
    expect(jsonTooDeep(`{"a":${nested(3)}}`, 4)).toBeNull();
    expect(jsonTooDeep(`{"a":${nested(4)}}`, 4)).toBe("a.0.0.0");
  });

  it("names the path of keys and indexes to where it goes too deep", () => {
    const body = `{"protocolVersion":1,"mutations":[{"id":1,"name":"outing.put","args":{}},{"id":2,"args":{"id":${nested(10)}}}]}`;
    expect(jsonTooDeep(body, 6)).toBe("mutations.1.args.id.0.0");
    expect(jsonTooDeep(`[1,2,[3,[4]],${nested(3)}]`, 3)).toBe("3.0.0");
  });

  it("does not count brackets, braces, colons, commas or escaped quotes inside strings", () => {
    const tricky = `{"a\\":[[[":"[[[[{{{{,,:","b":["]]]]\\"[[[["]}`;
    expect(JSON.parse(tricky)).toBeTruthy();
    expect(jsonTooDeep(tricky, 2)).toBeNull();
    expect(jsonTooDeep(`{"k[":{"x,":[[1]]}}`, 3)).toBe("k[.x,.0");
  });

  it("walks a body nested a hundred thousand deep without running out of stack", () => {
    expect(jsonTooDeep(nested(100_000))).toBe(Array(MAX_JSON_DEPTH).fill(0).join("."));
  });

  it("shows a caller's key cut to 40 characters, without control or direction characters", () => {
    const key = "\u202eevil\u0007\u061c" + "k".repeat(100);
    // Written raw: the scan runs before the text is parsed, so even a control character JSON
    // forbids unescaped can reach it.
    const path = jsonTooDeep(`{"${key}":[[1]]}`, 2);
    expect(path).toBe(`?evil??${"k".repeat(33)}.0`);
  });
});
