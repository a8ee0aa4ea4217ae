import "server-only";
import pino from "pino";

// Structured JSON lines on stderr. Callers pass codes and ids, never positions or secrets.
export const logger = pino(
  { level: process.env.LODEBOOK_LOG ?? "info", base: undefined, redact: ["*.password", "*.passwordHash", "*.lat", "*.lon", "*.cookie"] },
  pino.destination(2),
);
