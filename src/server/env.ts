import "server-only";
import { z } from "zod";

/**
 * Every environment variable the server reads, with its default, checked once per read.
 * Read through `serverEnv()`, never `process.env` elsewhere: tests and scripts change
 * variables between runs, so nothing here is cached.
 */
const origin = z
  .url({ protocol: /^https?$/, error: "must be an http(s) URL such as https://club.example" })
  .transform((u) => new URL(u))
  .refine((u) => u.pathname === "/" || u.pathname === "", "must be an origin only (no path)")
  .refine((u) => !u.username && !u.password && !u.search && !u.hash, "must not carry credentials, a query or a fragment")
  .transform((u) => u.origin);

const flag = z.enum(["true", "false", "1", "0"]).transform((v) => v === "true" || v === "1");

const envSchema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z.string().min(1).default("./data/lodebook.db"),
  LODEBOOK_MIGRATIONS: z.string().min(1).default("drizzle"),
  AUTH_SECRET: z.string().min(16, "must be at least 16 characters").optional(),
  /** The one origin every absolute URL in mail and redirects is built from. */
  LODEBOOK_ORIGIN: origin.optional(),
  /** Auth.js's own name for the same thing; used when LODEBOOK_ORIGIN is not set. */
  AUTH_URL: z.string().optional(),
  /** How many reverse proxies in front of the server may be believed about the caller's address. */
  LODEBOOK_TRUSTED_PROXIES: z.coerce.number().int().min(0).max(10).default(0),
  SMTP_HOST: z.string().min(1).default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  SMTP_SECURE: flag.default(false),
  SMTP_USER: z.string().default("lodebook"),
  SMTP_PASSWORD: z.string().default("lodebook"),
  MAIL_FROM: z.string().min(3).default("Lodebook <lodebook@localhost>"),
  LODEBOOK_MAIL_DIR: z.string().min(1).optional(),
  LODEBOOK_LOG: z.enum(["fatal", "error", "warn", "info", "debug", "trace", "silent"]).default("info"),
  LODEBOOK_PHOTO_DIR: z.string().min(1).default("./data/photos"),
  /** Photo uploads still coming in, chunk by chunk (default: `.partial` inside LODEBOOK_PHOTO_DIR). */
  LODEBOOK_UPLOAD_DIR: z.string().min(1).optional(),
  /** Photo bytes each member may keep on the server, in MB (deleted photos count until purged). */
  LODEBOOK_PHOTO_QUOTA_MB: z.coerce.number().positive().max(1_000_000).default(500),
  LODEBOOK_TOMBSTONE_DAYS: z.coerce.number().positive().default(180),
  /** The largest basemap (PMTiles archive) an officer may upload, in MB. */
  LODEBOOK_BASEMAP_MAX_MB: z.coerce.number().positive().max(16_384).default(300),
  LODEBOOK_S3_BUCKET: z.string().min(1).optional(),
  LODEBOOK_S3_REGION: z.string().min(1).default("us-east-1"),
  LODEBOOK_S3_ENDPOINT: z.url().optional(),
  LODEBOOK_S3_PREFIX: z.string().default(""),
  AWS_ACCESS_KEY_ID: z.string().min(1).optional(),
  AWS_SECRET_ACCESS_KEY: z.string().min(1).optional(),
});

export type ServerEnv = z.infer<typeof envSchema>;

/** Empty strings count as unset, as shells and .env files often leave them. */
function present(source: Readonly<Record<string, string | undefined>>): Record<string, string> {
  const out: Record<string, string> = {};
  for (const key of Object.keys(envSchema.shape)) {
    const value = source[key];
    if (value !== undefined && value !== "") out[key] = value;
  }
  return out;
}

export class EnvError extends Error {}

export function serverEnv(source: Readonly<Record<string, string | undefined>> = process.env): ServerEnv {
  const parsed = envSchema.safeParse(present(source));
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    throw new EnvError(`Lodebook's settings are not valid:\n  ${lines.join("\n  ")}`);
  }
  return parsed.data;
}

/** Used only outside production, so the demo and `next dev` work on a fresh checkout. */
export const DEVELOPMENT_ORIGIN = "http://localhost:3000";

/**
 * The site's origin, from configuration only: never from Host or X-Forwarded-* headers, which
 * a stranger chooses. Null in production when nothing is configured; mail that would carry a
 * link is then refused (see `requireSiteOrigin`).
 */
export function siteOrigin(env: ServerEnv = serverEnv()): string | null {
  if (env.LODEBOOK_ORIGIN) return env.LODEBOOK_ORIGIN;
  if (env.AUTH_URL) {
    const fromAuth = origin.safeParse(URL.canParse(env.AUTH_URL) ? new URL(env.AUTH_URL).origin : env.AUTH_URL);
    if (fromAuth.success) return fromAuth.data;
  }
  return env.NODE_ENV === "production" ? null : DEVELOPMENT_ORIGIN;
}

export const MISSING_ORIGIN_MESSAGE =
  "LODEBOOK_ORIGIN is not set, so Lodebook will not send sign-in links or invitations: it builds every link from that setting and never from the request. Set it to the address members open, e.g. LODEBOOK_ORIGIN=https://club.example.";
