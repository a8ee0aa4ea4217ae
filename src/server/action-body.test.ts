import { describe, expect, it } from "vitest";
import { checkActionBody } from "./action-body";
import { AppError } from "./errors";

// Bodies React's reply decoder throws on (Next then answers 500), each refused with a 400 that
// names the part; and the shapes the app's own forms send, let through. The browser's shape is
// the one Chromium sent for the sign-in form: the state, then "$K1" for the form's "_1_" fields.
const site = "http://localhost:3000/sign-in";
const scripted = (body: BodyInit, type?: string) =>
  new Request(site, { method: "POST", headers: { "next-action": "7f00", ...(type ? { "content-type": type } : {}) }, body });
const plainForm = (body: BodyInit, type?: string) => new Request(site, { method: "POST", ...(type ? { headers: { "content-type": type } } : {}), body });
const form = (fields: Record<string, string | Blob>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.append(k, v);
  return f;
};

async function refusal(request: Request): Promise<string | null> {
  try {
    await checkActionBody(request);
    return null;
  } catch (error) {
    if (!(error instanceof AppError)) throw error;
    expect(error.code).toBe("bad_request:action_body");
    expect(error.status).toBe(400);
    return error.message;
  }
}

const nested = (depth: number) => "[" + "[".repeat(depth) + "1" + "]".repeat(depth) + "]";

describe("a call from script (Next-Action header)", () => {
  it.each([
    ["garbage", /arguments could not be read: it is not JSON/],
    ["[", /not JSON/],
    ["", /not JSON/],
    ['"x"', /arguments must be a list/],
    ["null", /must be a list/],
    ['{"0":{}}', /must be a list/],
    ['["$Q9"]', /plain values and the form only/],
    ['["$h1"]', /plain values and the form only/],
    ['["$B1"]', /plain values and the form only/],
    ['["$@1"]', /plain values and the form only/],
    ['[{"message":"$F1"}]', /plain values and the form only/],
    ['[{},"$K1x"]', /plain values and the form only/],
    [nested(40), /plain values and the form only/],
  ])("text %j is refused", async (body, message) => {
    expect(await refusal(scripted(body, "text/plain;charset=UTF-8"))).toMatch(message);
  });

  it.each([
    "[]",
    "[{},1]",
    '["abc"]',
    "[null,null]",
    '[{},"$K1"]',
    '[{"ok":false,"message":"$$ sign","fields":{"email":["x"]}},"$Ka"]',
    '[{"a":"$undefined","n":"$NaN"}]',
    nested(10),
  ])("text %j goes on to the action", async (body) => {
    expect(await refusal(scripted(body, "text/plain;charset=UTF-8"))).toBeNull();
  });

  it("a form body: its arguments field must be there and readable", async () => {
    expect(await refusal(scripted(form({ "0": '[{},"$K1"]', _1_email: "ines@quillmarsh.example", _1_password: "x" })))).toBeNull();
    expect(await refusal(scripted(form({ _1_email: "x" })))).toMatch(/no arguments field \("0"\)/);
    expect(await refusal(scripted(form({ "0": new Blob(["[]"]) })))).toMatch(/no arguments field/);
    expect(await refusal(scripted(form({ "0": "garbage" })))).toMatch(/field "0" \(the arguments\) could not be read/);
    expect(await refusal(scripted(form({ "0": '[{},"$Q1"]', "1": '[["a","b"]]' })))).toMatch(/plain values and the form only/);
    const boundary = "lodebook";
    const cut = `--${boundary}\r\nContent-Disposition: form-data; name="0"\r\n\r\n[{},"$K1"]\r\n--${boundary}\r\nContent-Disp`;
    expect(await refusal(scripted(cut, `multipart/form-data; boundary=${boundary}`))).toMatch(/form could not be read/);
    expect(await refusal(scripted("junk", "multipart/form-data"))).toMatch(/form could not be read/);
  });
});

// The body as Next's action handler reads it, not as a browser's form reader would: where the
// two differ, the check saw one set of arguments and React another.
describe("read as Next reads it", () => {
  const boundary = "lodebook";
  const part = (headers: string, value: string | Buffer) =>
    Buffer.concat([Buffer.from(`--${boundary}\r\n${headers}\r\n\r\n`), Buffer.from(value), Buffer.from("\r\n")]);
  const multipart = (...parts: Buffer[]) => Buffer.concat([...parts, Buffer.from(`--${boundary}--\r\n`)]);
  const type = `multipart/form-data; boundary=${boundary}`;
  const bom = Buffer.from([0xef, 0xbb, 0xbf]);

  it("a byte-order mark before the arguments stays (Next keeps it, and JSON.parse throws on it)", async () => {
    expect(await refusal(scripted(Buffer.concat([bom, Buffer.from('[{},"$K1"]')]), "text/plain;charset=UTF-8"))).toMatch(/not JSON/);
    const body = multipart(part('Content-Disposition: form-data; name="0"', Buffer.concat([bom, Buffer.from('[{},"$K1"]')])));
    expect(await refusal(scripted(body, type))).toMatch(/field "0" \(the arguments\) could not be read/);
  });

  it("a part in its declared character set", async () => {
    const body = multipart(part('Content-Disposition: form-data; name="0"\r\nContent-Type: text/plain; charset=utf-16le', '[{},"$K1"]'));
    expect(await refusal(scripted(body, type))).toMatch(/could not be read/);
    const latin = multipart(part('Content-Disposition: form-data; name="0"\r\nContent-Type: text/plain; charset=iso-8859-1', '[{},"$K1"]'));
    expect(await refusal(scripted(latin, type))).toBeNull();
  });

  it("an upper-case multipart type is text to Next", async () => {
    const body = multipart(part('Content-Disposition: form-data; name="0"', '[{},"$K1"]'));
    expect(await refusal(scripted(body, `Multipart/form-data; boundary=${boundary}`))).toMatch(/arguments could not be read: it is not JSON/);
  });

  it("a part with no name Next's reader finds (named only by name*=) is refused", async () => {
    const body = multipart(part("Content-Disposition: form-data; name*=utf-8''0", '["$Q1"]'), part('Content-Disposition: form-data; name="0"', '[{},"$K1"]'));
    expect(await refusal(scripted(body, type))).toMatch(/needs its name/);
  });

  it("the first of a part's repeated headers and of a repeated field", async () => {
    const twice = multipart(
      part('Content-Disposition: form-data; name="0"\r\nContent-Disposition: form-data; name="x"', '["$Q1"]'),
      part('Content-Disposition: form-data; name="0"', '[{},"$K1"]'),
    );
    expect(await refusal(scripted(twice, type))).toMatch(/plain values and the form only/);
    const good = multipart(part('Content-Disposition: form-data; name="_1_email"', "x"), part('Content-Disposition: form-data; name="0"', '[{},"$K1"]'));
    expect(await refusal(scripted(good, type))).toBeNull();
  });
});

describe("a form posted without script", () => {
  const ref = (head: string, bound?: string | Blob) => ({
    $ACTION_REF_1: "",
    "$ACTION_1:0": head,
    ...(bound === undefined ? {} : { "$ACTION_1:1": bound }),
    $ACTION_KEY: "k",
    email: "ines@quillmarsh.example",
  });
  const id = '"id":"7f00"';

  it("the browser's own shapes go on to Next", async () => {
    expect(await refusal(plainForm(form(ref(`{${id},"bound":"$@1"}`, "[{}]"))))).toBeNull();
    expect(await refusal(plainForm(form(ref(`{${id},"bound":null}`))))).toBeNull();
    expect(await refusal(plainForm(form({ $ACTION_ID_7f00: "", email: "x" })))).toBeNull();
    expect(await refusal(plainForm(form({ email: "x" })))).toBeNull();
  });

  it("an action's reference React could not read is refused, under any name", async () => {
    expect(await refusal(plainForm(form(ref("garbage"))))).toMatch(/"\$ACTION_1:0" \(the action's reference\) could not be read/);
    expect(await refusal(plainForm(form(ref(`{${id},`))))).toMatch(/could not be read/);
    expect(await refusal(plainForm(form(ref(`{${id}}x`))))).toMatch(/could not be read/);
    expect(await refusal(plainForm(form(ref("[1]"))))).toMatch(/must be an object/);
    expect(await refusal(plainForm(form({ $ACTION_REF_1: "", email: "x" })))).toMatch(/"\$ACTION_1:0" \(the action's reference\) is missing/);
    // React takes any name after "$ACTION_REF_", an empty one too.
    for (const name of ["x", "1234567", ""]) {
      const fields = { [`$ACTION_REF_${name}`]: "", [`$ACTION_${name}:0`]: `{${id},"bound":"$@1"}`, [`$ACTION_${name}:1`]: "not json" };
      expect(await refusal(plainForm(form(fields))), name).toMatch(new RegExp(`"\\$ACTION_${name}:1" could not be read`));
    }
  });

  it("bound arguments React could not decode are refused, naming their field", async () => {
    expect(await refusal(plainForm(form(ref(`{${id},"bound":"$@1"}`, "garbage"))))).toMatch(/field "\$ACTION_1:1" could not be read/);
    expect(await refusal(plainForm(form(ref(`{${id},"bound":"$@1"}`, '"x"'))))).toMatch(/field "\$ACTION_1:1" must be a list/);
    expect(await refusal(plainForm(form(ref(`{${id},"bound":"$@1"}`, '["$Q2"]'))))).toMatch(/plain values and the form only/);
    expect(await refusal(plainForm(form(ref(`{${id},"bound":"$@1"}`))))).toMatch(/"\$ACTION_1:1" \(the bound arguments\) is missing/);
    expect(await refusal(plainForm(form(ref(`{${id},"bound":"$Q1"}`, "[{}]"))))).toMatch(/names its bound arguments wrongly/);
    expect(await refusal(plainForm(form(ref(`{"id":"$Q1","bound":null}`))))).toMatch(/"\$ACTION_1:0" may hold plain values only/);
    expect(await refusal(plainForm(form(ref(`{${id},"bound":"$@1"}`, new Blob(["[{}]"])))))).toMatch(/"\$ACTION_1:1" must be text/);
    // "$@a" is part 10: React numbers the parts in hexadecimal.
    expect(await refusal(plainForm(form({ ...ref(`{${id},"bound":"$@a"}`), "$ACTION_1:10": "garbage" })))).toMatch(/"\$ACTION_1:10"/);
  });

  it("a URL-encoded form is no action to Next without script (it decodes none): left alone", async () => {
    const body = new URLSearchParams({ $ACTION_REF_1: "", "$ACTION_1:0": `{${id},"bound":"$@1"}`, "$ACTION_1:1": "garbage" });
    expect(await refusal(plainForm(body))).toBeNull();
  });

  it("a post that is not a form is not an action to Next: left alone", async () => {
    expect(await refusal(plainForm("garbage", "text/plain"))).toBeNull();
  });
});
