import "server-only";

// One error type, one status table. Codes read "<kind>:<subject>", e.g. "forbidden:club".
export type ErrorKind =
  "bad_request" | "unauthorized" | "forbidden" | "not_found" | "conflict" | "rate_limited" | "too_large" | "unsupported" | "gone" | "unavailable";

const STATUS: Record<ErrorKind, number> = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  unsupported: 415,
  gone: 410,
  rate_limited: 429,
  unavailable: 503,
};

export type FieldErrors = Record<string, string[]>;

export class AppError extends Error {
  readonly kind: ErrorKind;
  readonly subject: string;
  readonly fields?: FieldErrors;
  constructor(code: `${ErrorKind}:${string}`, message: string, fields?: FieldErrors) {
    super(message);
    const [kind, subject] = code.split(":") as [ErrorKind, string];
    this.kind = kind;
    this.subject = subject;
    this.fields = fields;
  }
  get code() {
    return `${this.kind}:${this.subject}`;
  }
  get status() {
    return STATUS[this.kind];
  }
  toJSON() {
    return { error: { code: this.code, message: this.message, ...(this.fields ? { fields: this.fields } : {}) } };
  }
}
