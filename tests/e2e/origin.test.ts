import { describe, expect, inject, it } from "vitest";

const baseUrl = inject("baseUrl");

/** The sign-in form's server action id, as React writes it into the page for progressive enhancement. */
async function signInActionId(): Promise<string> {
  const html = await (await fetch(`${baseUrl}/sign-in`)).text();
  const id = html.match(/name="\$ACTION_ID_([0-9a-f]+)"/)?.[1];
  if (!id) throw new Error("no server action id on the sign-in page");
  return id;
}

async function callAction(id: string, origin: string | null) {
  const form = new FormData();
  form.set("email", "ines@quillmarsh.example");
  form.set("password", "member-demo-pass");
  const headers: Record<string, string> = { "Next-Action": id, Host: new URL(baseUrl).host };
  if (origin !== null) headers.Origin = origin;
  return fetch(`${baseUrl}/sign-in`, { method: "POST", body: form, headers, redirect: "manual" });
}

describe("server actions keep Next's origin check (RELIABILITY 27)", () => {
  it("refuses a foreign Origin and a null Origin; a same-origin call goes through", async () => {
    const id = await signInActionId();
    for (const origin of ["https://evil.example", "null"]) {
      const res = await callAction(id, origin);
      expect(res.status, `Origin ${origin}`).not.toBe(200);
      expect(res.status, `Origin ${origin}`).not.toBe(303);
      expect(res.headers.get("set-cookie") ?? "").not.toMatch(/authjs\.session-token/);
    }
    const ok = await callAction(id, baseUrl);
    expect([200, 303]).toContain(ok.status);
    expect(ok.headers.get("set-cookie") ?? "").toMatch(/authjs\.session-token/);
  });
});
