import type { Totals } from "./totals";

export type MonthlyProduction = Totals & { month: string; claimId: string | null; claimName: string | null };
