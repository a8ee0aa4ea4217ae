import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";

const NEXT_BIN = path.resolve("node_modules/next/dist/bin/next");

/** Runs `next build --webpack` (Serwist needs webpack) and resolves when it succeeds. */
export function buildApp(env: NodeJS.ProcessEnv = process.env): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [NEXT_BIN, "build", "--webpack"], { stdio: "inherit", env });
    child.on("exit", (code) => (code === 0 ? resolve() : reject(new Error(`next build exited with ${code}`))));
  });
}

const SERVE = path.resolve("scripts/serve.mjs");

/**
 * Starts the production server (Next behind the front door, scripts/serve.mjs) and waits until
 * it answers. Stopped by the pid it was started with, never looked for by name.
 */
export async function startApp(opts: {
  port: number;
  env: NodeJS.ProcessEnv;
  quiet?: boolean;
}): Promise<{ url: string; child: ChildProcess; stop: () => Promise<void> }> {
  const child = spawn(process.execPath, [SERVE, "--port", String(opts.port), "--hostname", "127.0.0.1"], {
    env: { ...opts.env, NODE_ENV: "production" },
    stdio: opts.quiet ? ["ignore", "ignore", "pipe"] : "inherit",
  });
  const stderr: string[] = [];
  child.stderr?.on("data", (b: Buffer) => stderr.push(b.toString()));
  const url = `http://localhost:${opts.port}`;
  const deadline = Date.now() + 60_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the server exited with ${child.exitCode}\n${stderr.join("")}`);
    try {
      const res = await fetch(`${url}/sign-in`);
      if (res.ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) throw new Error("the app did not answer within 60 s");
    await new Promise((r) => setTimeout(r, 250));
  }
  const stop = () =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve();
      child.once("exit", () => resolve());
      child.kill("SIGTERM");
      setTimeout(() => child.kill("SIGKILL"), 5000).unref();
    });
  return { url, child, stop };
}
