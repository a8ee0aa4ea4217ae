import { describe, expect, inject, it } from "vitest";

const baseUrl = inject("baseUrl");
const decode = (s: string) =>
  s
    .replace(/&quot;/g, '"')
    .replace(/&amp;/g, "&")
    .replace(/&#x27;/g, "'")
    .replace(/&lt;/g, "<")
    .replace(/&gt;/g, ">");

/** The sign-in form exactly as a browser without JavaScript would post it (React's hidden action fields included). */
async function signInForm(): Promise<FormData> {
  const html = await (await fetch(`${baseUrl}/sign-in`)).text();
  const form = new FormData();
  const firstForm = html.slice(html.indexOf("<form"), html.indexOf("</form>"));
  for (const m of firstForm.matchAll(/<input type="hidden" name="([^"]+)"(?: value="([^"]*)")?/g)) form.set(decode(m[1]), decode(m[2] ?? ""));
  if (![...form.keys()].some((k) => k.startsWith("$ACTION"))) throw new Error("no server action fields on the sign-in page");
  form.set("email", "ines@quillmarsh.example");
  form.set("password", "member-demo-pass");
  return form;
}

async function post(origin: string | null) {
  const headers: Record<string, string> = {};
  if (origin !== null) headers.Origin = origin;
  return fetch(`${baseUrl}/sign-in`, { method: "POST", body: await signInForm(), headers, redirect: "manual" });
}

describe("server actions keep Next's origin check (RELIABILITY 27)", () => {
  it("refuses a foreign Origin and a null Origin; a same-origin post signs in", async () => {
    for (const origin of ["https://evil.example", "null"]) {
      const res = await post(origin);
      expect(res.headers.get("set-cookie") ?? "", `Origin ${origin}`).not.toMatch(/authjs\.session-token=[^;]/);
      expect(res.status, `Origin ${origin}`).not.toBe(303);
    }
    const ok = await post(baseUrl);
    const cookie = ok.headers.get("set-cookie") ?? "";
    expect(cookie).toMatch(/authjs\.session-token=[^;]/);
    // The session cookie is out of scripts' reach and not sent on cross-site requests.
    const session = cookie.split(/,(?=\s*[\w.-]+=)/).find((c) => c.includes("authjs.session-token="))!;
    expect(session).toMatch(/HttpOnly/i);
    expect(session).toMatch(/SameSite=Lax/i);
  });
});
