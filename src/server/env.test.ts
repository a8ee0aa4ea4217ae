import { describe, expect, it } from "vitest";
import { DEVELOPMENT_ORIGIN, EnvError, serverEnv, siteOrigin } from "./env";

describe("the server's settings", () => {
  it("takes the site origin from configuration only, normalised to an origin", () => {
    expect(siteOrigin(serverEnv({ LODEBOOK_ORIGIN: "https://Club.Example:443" }))).toBe("https://club.example");
    expect(siteOrigin(serverEnv({ LODEBOOK_ORIGIN: "http://192.168.1.20:3000/" }))).toBe("http://192.168.1.20:3000");
    expect(siteOrigin(serverEnv({ AUTH_URL: "https://club.example/api/auth" }))).toBe("https://club.example");
    expect(siteOrigin(serverEnv({ NODE_ENV: "development" }))).toBe(DEVELOPMENT_ORIGIN);
    // Production with nothing configured: no origin at all, never a guess from a request.
    expect(siteOrigin(serverEnv({ NODE_ENV: "production" }))).toBeNull();
    expect(siteOrigin(serverEnv({ NODE_ENV: "production", LODEBOOK_ORIGIN: "" }))).toBeNull();
  });

  it("refuses an origin with a path, credentials, a query or another scheme, naming the setting", () => {
    for (const bad of ["https://club.example/app", "https://user:pw@club.example", "https://club.example/?x=1", "ftp://club.example", "club.example"]) {
      expect(() => serverEnv({ LODEBOOK_ORIGIN: bad }), bad).toThrow(EnvError);
      expect(() => serverEnv({ LODEBOOK_ORIGIN: bad }), bad).toThrow(/LODEBOOK_ORIGIN/);
    }
  });

  it("names every invalid setting at once", () => {
    const error = (() => {
      try {
        serverEnv({ LODEBOOK_TRUSTED_PROXIES: "-1", SMTP_PORT: "smtp", LODEBOOK_PHOTO_QUOTA_MB: "0" });
      } catch (e) {
        return (e as Error).message;
      }
    })();
    expect(error).toMatch(/LODEBOOK_TRUSTED_PROXIES/);
    expect(error).toMatch(/SMTP_PORT/);
    expect(error).toMatch(/LODEBOOK_PHOTO_QUOTA_MB/);
  });

  it("defaults what it can", () => {
    const env = serverEnv({});
    expect(env.LODEBOOK_TRUSTED_PROXIES).toBe(0);
    expect(env.LODEBOOK_TOMBSTONE_DAYS).toBe(180);
    expect(env.SMTP_SECURE).toBe(false);
  });
});
