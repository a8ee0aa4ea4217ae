import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";

/**
 * Defaults for running Lodebook from this checkout: the database and caught mail under
 * ./data, a local mail catcher, and an AUTH_SECRET made once and kept in ./data.
 */
export function applyLocalDefaults(dataDir = path.resolve("data")): void {
  fs.mkdirSync(dataDir, { recursive: true });
  process.env.DATABASE_URL ??= path.join(dataDir, "lodebook.db");
  process.env.LODEBOOK_PHOTO_DIR ??= path.join(dataDir, "photos");
  process.env.SMTP_HOST ??= "127.0.0.1";
  process.env.SMTP_PORT ??= "2525";
  if (!process.env.AUTH_SECRET) {
    const file = path.join(dataDir, "auth-secret");
    if (!fs.existsSync(file)) fs.writeFileSync(file, crypto.randomBytes(32).toString("base64url"), { mode: 0o600 });
    process.env.AUTH_SECRET = fs.readFileSync(file, "utf8").trim();
  }
}
