import { describe, expect, it } from "vitest";
import { z } from "zod";
import { badRequest, callerHungUp, fieldErrorsOf, jsonTooDeep, MAX_JSON_DEPTH, MAX_LISTED_PROBLEMS, route } from "./http";

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

describe("a caller who hangs up part-way through its body (route)", () => {
  // Node fails the body's read with this when the socket closes before the body's end.
  const hungUp = () => Object.assign(new Error("aborted"), { code: "ECONNRESET" });

  it("is no server failure: a 400 saying so, not a 500 with an error id", async () => {
    const res = await route(async () => {
      throw hungUp();
    })(new Request("http://localhost/api/estimate", { method: "POST" }), {});
    expect(res.status).toBe(400);
    expect((await res.json()).error.code).toBe("bad_request:incomplete");
  });

  it("an error of the server's own is still a logged 500, even a reset from elsewhere", async () => {
    for (const error of [new Error("boom"), Object.assign(new Error("read ECONNRESET"), { code: "ECONNRESET" })]) {
      const res = await route(async () => {
        throw error;
      })(new Request("http://localhost/api/estimate", { method: "POST" }), {});
      expect(res.status, error.message).toBe(500);
      expect((await res.json()).error.errorId).toMatch(/^[0-9a-f-]{36}$/);
    }
  });

  it("knows the hang-up by the request's signal too", () => {
    const controller = new AbortController();
    const req = new Request("http://localhost/api/estimate", { method: "POST", signal: controller.signal });
    expect(callerHungUp(req, new Error("anything"))).toBe(false);
    controller.abort();
    expect(callerHungUp(req, new Error("anything"))).toBe(true);
  });
});

describe("what an answer says of a bad body (fieldErrorsOf): enough to mend it, never the body again", () => {
  it("names at most five unknown fields, each cut short, and counts the rest", () => {
    const body = Object.fromEntries(Array.from({ length: 60_000 }, (_, i) => [`extra${i}`, i]));
    const parsed = z
      .object({ name: z.string() })
      .strict()
      .safeParse({ name: "Larkspur", ...body });
    const fields = fieldErrorsOf(parsed.error!);
    expect(fields._).toEqual(['Fields "extra0", "extra1", "extra2", "extra3", "extra4" and 59995 more not known here.']);
    const long = z
      .object({})
      .strict()
      .safeParse({ ["k".repeat(10_000) + "\u202e"]: 1 });
    expect(fieldErrorsOf(long.error!)._[0]).toBe(`Field "${"k".repeat(40)}" not known here.`);
    // A schema's own words for it stand.
    const own = z.object({}, { error: "Send the claim's fields only." }).strict().safeParse({ x: 1 });
    expect(fieldErrorsOf(own.error!)._).toEqual(["Send the claim's fields only."]);
  });

  it("lists at most MAX_LISTED_PROBLEMS problems, then how many more", () => {
    const parsed = z.array(z.number("Enter a number.")).safeParse(Array.from({ length: 1000 }, () => "x"));
    const fields = fieldErrorsOf(parsed.error!);
    expect(Object.keys(fields)).toHaveLength(MAX_LISTED_PROBLEMS + 1);
    expect(fields["0"]).toEqual(["Enter a number."]);
    expect(fields._).toEqual([`And ${1000 - MAX_LISTED_PROBLEMS} more problems like these.`]);
    expect(JSON.stringify(badRequest("claims", parsed.error!).toJSON()).length).toBeLessThan(2000);
  });

  it("a field's path names a caller's key cut to 40 characters, its direction marks shown", () => {
    const parsed = z.record(z.string(), z.number("Enter a number.")).safeParse({ ["\u202e" + "a".repeat(100)]: "x" });
    expect(Object.keys(fieldErrorsOf(parsed.error!))).toEqual(["?" + "a".repeat(39)]);
  });
});
