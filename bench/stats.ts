/** Median with min and max of repeated measurements. */
export function summary(values: number[]) {
  const s = [...values].sort((a, b) => a - b);
  const mid = s.length >> 1;
  const median = s.length % 2 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
  return { median, min: s[0], max: s[s.length - 1] };
}

export function percentile(values: number[], p: number) {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)];
}

export async function repeat(n: number, fn: () => Promise<number> | number): Promise<number[]> {
  const out: number[] = [];
  for (let i = 0; i < n; i++) out.push(await fn());
  return out;
}

const fmt = (n: number, digits = 2) => (Math.abs(n) >= 100 ? n.toFixed(0) : n.toFixed(digits));

/** One line per figure: its value (median, min–max), the ratio measured side by side, the goal and the verdict. */
export function report(name: string, opts: { value: number[]; unit: string; ratio?: number[]; ratioLabel?: string; goal: string; pass: boolean }) {
  const v = summary(opts.value);
  const r = opts.ratio ? summary(opts.ratio) : undefined;
  const ratio = r ? ` · ${opts.ratioLabel ?? "ratio"} ${fmt(r.median)} (${fmt(r.min)}–${fmt(r.max)})` : "";
  console.log(`${opts.pass ? "MEETS" : "MISSES"}  ${name}: ${fmt(v.median)} ${opts.unit} (${fmt(v.min)}–${fmt(v.max)})${ratio} · goal ${opts.goal}`);
}
