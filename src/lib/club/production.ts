export type MonthlyProduction = { month: string; claimId: string | null; claimName: string | null; finds: number; weightGrams: number; fineGrams: number };
