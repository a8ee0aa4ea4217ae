import "server-only";
import { serverEnv } from "./env";
import pino from "pino";

// Structured JSON lines on stderr. Callers pass codes and ids, never positions or secrets.
export const logger = pino(
  { level: serverEnv().LODEBOOK_LOG, base: undefined, redact: ["*.password", "*.passwordHash", "*.lat", "*.lon", "*.cookie"] },
  pino.destination(2),
);
