// Roles are data: the server's guards and the UI both read this one map.
export const ROLES = ["member", "officer"] as const;
export type Role = (typeof ROLES)[number];

export const CAPABILITY_NAMES = [
  "logFinds",
  "viewLedger",
  "reviewFinds",
  "manageClaims",
  "manageMembers",
  "managePrices",
  "readCaughtMail",
  "downloadBackup",
] as const;
export type Capability = (typeof CAPABILITY_NAMES)[number];

export const CAPABILITIES: Record<Role, Record<Capability, boolean>> = {
  member: {
    logFinds: true,
    viewLedger: false,
    reviewFinds: false,
    manageClaims: false,
    manageMembers: false,
    managePrices: false,
    readCaughtMail: false,
    downloadBackup: false,
  },
  officer: {
    logFinds: true,
    viewLedger: true,
    reviewFinds: true,
    manageClaims: true,
    manageMembers: true,
    managePrices: true,
    readCaughtMail: true,
    downloadBackup: true,
  },
};

export function can(role: Role | undefined, capability: Capability): boolean {
  return role !== undefined && CAPABILITIES[role][capability];
}

export const ROLE_LABELS: Record<Role, string> = { member: "Member", officer: "Club officer" };

/** Where each role lands after signing in when no other page was asked for. */
export const ROLE_HOME: Record<Role, string> = { member: "/", officer: "/club" };
