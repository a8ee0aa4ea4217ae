import { GET, POST } from "@/app/api/auth/[...nextauth]/route";

/** A browser's cookie jar, as far as these tests need one. */
export class CookieJar {
  private cookies = new Map<string, string>();
  take(res: Response): this {
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(";");
      const at = pair.indexOf("=");
      const name = pair.slice(0, at).trim();
      const value = pair.slice(at + 1).trim();
      if (value === "" || /max-age=0\b/i.test(line) || /expires=thu, 01 jan 1970/i.test(line)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
    return this;
  }
  has(prefix: string): boolean {
    return [...this.cookies.keys()].some((k) => k.startsWith(prefix));
  }
  header(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; ");
  }
}

const ctx = (path: string) => ({ params: Promise.resolve({ nextauth: path.split("/").filter(Boolean).slice(2) }) });

/** Auth.js's CSRF token for this jar (a real browser fetches it the same way). */
export async function csrfToken(jar: CookieJar): Promise<string> {
  const res = await GET(new Request("http://localhost:3000/api/auth/csrf", { headers: { cookie: jar.header() } }));
  jar.take(res);
  return ((await res.json()) as { csrfToken: string }).csrfToken;
}

type Body = { form: [string, string][] } | { json: Record<string, unknown> };

/** POSTs to an Auth.js endpoint as a browser would, with the CSRF token added to the body. */
export async function postAuth(path: string, body: Body, opts: { jar?: CookieJar; headers?: Record<string, string> } = {}): Promise<Response> {
  const jar = opts.jar ?? new CookieJar();
  const csrf = await csrfToken(jar);
  const headers = new Headers(opts.headers);
  headers.set("cookie", jar.header());
  let payload: string;
  if ("form" in body) {
    headers.set("content-type", "application/x-www-form-urlencoded");
    payload = new URLSearchParams([...body.form, ["csrfToken", csrf]]).toString();
  } else {
    headers.set("content-type", "application/json");
    payload = JSON.stringify({ ...body.json, csrfToken: csrf });
  }
  const res = await POST(new Request(new URL(path, "http://localhost:3000"), { method: "POST", headers, body: payload }), ctx(path));
  jar.take(res);
  return res;
}

/** A password sign-in through Auth.js's own endpoint. */
export function signInByPassword(email: string, password: string, opts: { jar?: CookieJar; headers?: Record<string, string> } = {}) {
  return postAuth(
    "/api/auth/callback/credentials",
    {
      form: [
        ["email", email],
        ["password", password],
      ],
    },
    opts,
  );
}

/** Signed in: Auth.js answered with a session cookie. */
export const signedIn = (res: Response) =>
  res.headers.getSetCookie().some((c) => c.startsWith("authjs.session-token=") || c.startsWith("__Secure-authjs.session-token="));
