import { afterAll, afterEach, beforeAll, beforeEach, vi } from "vitest";
import { resetSignInGuard } from "@/server/auth/sign-in-guard";
import type { Db } from "@/server/db";
import { resetLimits } from "@/server/limits";
import { startTestMail } from "./mail";
import { seededDatabase } from "./test-db";

/** The origin the door tests configure; every link the server builds must be on it. */
export const TEST_ORIGIN = "https://club.example";

export type TestMail = Awaited<ReturnType<typeof startTestMail>>;

/**
 * The door tests' frame: one seeded database and mail catcher per file, and before each test
 * the configured origin (with Auth.js's own URL unset), fresh limits and no caught mail.
 */
export function doorsSetup(name: string, use: (s: { db: Db; mail: TestMail }) => void): void {
  let mail: TestMail;
  beforeAll(async () => {
    const { db } = await seededDatabase();
    mail = await startTestMail(name);
    use({ db, mail });
  });
  afterAll(() => mail.stop());
  beforeEach(async () => {
    vi.stubEnv("LODEBOOK_ORIGIN", TEST_ORIGIN);
    vi.stubEnv("AUTH_URL", "");
    resetLimits();
    resetSignInGuard();
    await mail.clear();
  });
  afterEach(() => {
    vi.unstubAllEnvs();
    vi.restoreAllMocks();
  });
}
