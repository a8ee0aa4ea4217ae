import fs from "node:fs";
import path from "node:path";

export type Handler = (req: Request, ctx: unknown) => Response | Promise<Response>;

/** Every route handler in src/app/api, found from the file system: "METHOD /api/route". */
export function discoverHandlers(): { key: string; file: string; method: string }[] {
  const root = path.resolve("src/app/api");
  const out: { key: string; file: string; method: string }[] = [];
  const walk = (dir: string) => {
    for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, e.name);
      if (e.isDirectory()) walk(full);
      else if (e.name === "route.ts") {
        const src = fs.readFileSync(full, "utf8");
        const route = "/api/" + path.relative(root, dir).split(path.sep).join("/");
        for (const m of ["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE", "OPTIONS"])
          if (new RegExp(`export const (\\{[^}]*\\b${m}\\b[^}]*\\}|${m}\\b)`).test(src)) out.push({ key: `${m} ${route}`, file: full, method: m });
      }
    }
  };
  walk(root);
  return out;
}

/** The handler function itself. */
export async function loadHandler(h: { file: string; method: string }): Promise<Handler> {
  return ((await import(/* @vite-ignore */ h.file)) as Record<string, Handler>)[h.method];
}
