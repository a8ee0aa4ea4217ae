import { readBoundary, MAX_CLAIM_POSITIONS } from "../src/lib/club/geometry";
import { repeat, report, summary } from "./stats";

/**
 * RELIABILITY 34: the printable report over a whole club of more than 10 000 finds (it lists
 * the first 5000 and gives every subtotal), fetched whole by an officer, beside the same page
 * for a selection with no finds in the same run.
 */
export async function printableReport(baseUrl: string, officerCookie: string, finds: number) {
  const fetchAll = async (qs: string) => {
    const t = performance.now();
    const res = await fetch(`${baseUrl}/club/report?${qs}`, { headers: { cookie: officerCookie } });
    const body = await res.text();
    if (res.status !== 200 || !body.includes("Estimates are not assays")) throw new Error(`report answered ${res.status}`);
    return performance.now() - t;
  };
  await fetchAll(""); // first render compiles nothing, but warms the route's module
  const full = await repeat(5, () => fetchAll(""));
  const empty = await repeat(5, () => fetchAll("from=1990-01-01&to=1990-01-02"));
  const median = summary(full).median;
  report(`printable report of the whole club (${finds} finds: the first 5000 listed, every subtotal)`, {
    value: full,
    unit: "ms to the last byte",
    ratio: full.map((v, i) => v / empty[i]),
    ratioLabel: "× the same report of no finds",
    goal: "≤ 3000 ms (median)",
    pass: median <= 3000,
  });
}

/** A claim outline at the position limit, checked as the server and the claim editor check it, beside a five-corner one. */
export function claimOutline() {
  const ring = (n: number) => {
    const r = Array.from({ length: n }, (_, i) => [-117.6 + 0.01 * Math.cos((2 * Math.PI * i) / n), 41.8 + 0.01 * Math.sin((2 * Math.PI * i) / n)]);
    return { type: "Polygon", coordinates: [[...r, r[0]]] };
  };
  const big = ring(MAX_CLAIM_POSITIONS - 1);
  const small = ring(4);
  const time = (g: unknown) => {
    const t = performance.now();
    if (!readBoundary(g).ok) throw new Error("outline refused");
    return performance.now() - t;
  };
  time(big);
  const atLimit: number[] = [];
  const corners: number[] = [];
  for (let i = 0; i < 7; i++) {
    atLimit.push(time(big));
    corners.push(time(small));
  }
  const over = readBoundary(ring(50_000));
  report(`claim outline at the limit (${MAX_CLAIM_POSITIONS} positions; past it refused: "${over.ok ? "accepted!" : over.message.slice(0, 40)}…")`, {
    value: atLimit,
    unit: "ms to check",
    ratio: atLimit.map((v, i) => v / Math.max(corners[i], 0.001)),
    ratioLabel: "× a five-corner outline",
    goal: "≤ 250 ms (median) and refused past the limit",
    pass: summary(atLimit).median <= 250 && !over.ok,
  });
}
