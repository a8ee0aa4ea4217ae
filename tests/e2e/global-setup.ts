import crypto from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import type { TestProject } from "vitest/node";
import { buildApp, startApp } from "../../scripts/lib/app-server";
import { startMailCatcher } from "../../scripts/lib/mail-catcher";

declare module "vitest" {
  export interface ProvidedContext {
    baseUrl: string;
    mailDir: string;
    databaseUrl: string;
    photoDir: string;
  }
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

export default async function setup(project: TestProject) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-e2e-"));
  const [appPort, smtpPort] = [await freePort(), await freePort()];
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NEXT_TELEMETRY_DISABLED: "1",
    DATABASE_URL: path.join(dir, "lodebook.db"),
    AUTH_SECRET: crypto.randomBytes(32).toString("base64url"),
    LODEBOOK_MAIL_DIR: path.join(dir, "mail"),
    LODEBOOK_PHOTO_DIR: path.join(dir, "photos"),
    SMTP_HOST: "127.0.0.1",
    SMTP_PORT: String(smtpPort),
    LODEBOOK_LOG: "warn",
    LODEBOOK_ORIGIN: `http://localhost:${appPort}`,
  };
  Object.assign(process.env, env);

  // Seed through the same module the demo uses, before the server opens the file.
  const { getDb, closeDb } = await import("../../src/server/db");
  const { hashPassword } = await import("../../src/server/auth/password");
  const { seedDemoClub, DEMO_PASSWORDS } = await import("../../src/server/seed/demo-club");
  seedDemoClub(getDb(), { passwordHashes: { officer: await hashPassword(DEMO_PASSWORDS.officer), member: await hashPassword(DEMO_PASSWORDS.member) } });
  const { writeDemoBasemap } = await import("../../src/server/seed/demo-basemap");
  await writeDemoBasemap();
  closeDb();

  if (process.env.LODEBOOK_E2E_SKIP_BUILD !== "1") await buildApp(env);
  const mail = await startMailCatcher({ port: smtpPort, dir: env.LODEBOOK_MAIL_DIR! });
  const app = await startApp({ port: appPort, env, quiet: true });
  project.provide("baseUrl", app.url);
  project.provide("mailDir", env.LODEBOOK_MAIL_DIR!);
  project.provide("databaseUrl", env.DATABASE_URL!);
  project.provide("photoDir", env.LODEBOOK_PHOTO_DIR!);

  return async () => {
    await app.stop();
    await mail.close();
  };
}
