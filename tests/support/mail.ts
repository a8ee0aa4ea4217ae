import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { mailSettled } from "@/server/mail";
import { startMailCatcher } from "../../scripts/lib/mail-catcher";

export type Caught = { to: string[]; subject: string; text: string };

/**
 * A mail catcher of the test file's own on a free loopback port, with SMTP_PORT pointed at it.
 * Mail the server hands off is sent after its answers: `caught()` waits for it first.
 */
export async function startTestMail(prefix: string) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), `lodebook-${prefix}-mail-`));
  const port = 20000 + Math.floor(Math.random() * 20000);
  process.env.SMTP_PORT = String(port);
  const catcher = await startMailCatcher({ port, dir });
  return {
    async caught(): Promise<Caught[]> {
      await mailSettled();
      return fs
        .readdirSync(dir)
        .sort()
        .map((f) => JSON.parse(fs.readFileSync(path.join(dir, f), "utf8")) as Caught);
    },
    /** Lets the last test's mail land, then forgets it. */
    async clear(): Promise<void> {
      await mailSettled();
      for (const f of fs.readdirSync(dir)) fs.rmSync(path.join(dir, f));
    },
    async stop(): Promise<void> {
      await catcher.close();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}
