"use client";
import { BarController, BarElement, CategoryScale, Chart, Legend, LinearScale, Tooltip } from "chart.js";
import { useEffect, useRef } from "react";
import type { MonthlyProduction } from "@/lib/club/production";

Chart.register(BarController, BarElement, CategoryScale, LinearScale, Legend, Tooltip);

// Distinct in daylight and for common colour blindness (blue/orange/teal/purple/brown).
const COLOURS = ["#1f5fa8", "#c0601a", "#1a8073", "#7a3f9a", "#6b4a2b", "#a1265b"];

/** Estimated fine gold per month, stacked by claim. */
export function ProductionChart({ months }: { months: MonthlyProduction[] }) {
  const canvas = useRef<HTMLCanvasElement>(null);
  useEffect(() => {
    if (!canvas.current) return;
    const labels = [...new Set(months.map((m) => m.month))].sort();
    const claims = [...new Set(months.map((m) => m.claimName ?? "Off-claim"))];
    const chart = new Chart(canvas.current, {
      type: "bar",
      data: {
        labels,
        datasets: claims.map((name, i) => ({
          label: name,
          backgroundColor: COLOURS[i % COLOURS.length],
          data: labels.map((month) => months.filter((m) => m.month === month && (m.claimName ?? "Off-claim") === name).reduce((n, m) => n + m.fineGrams, 0)),
        })),
      },
      options: {
        responsive: true,
        maintainAspectRatio: false,
        animation: false,
        scales: { x: { stacked: true }, y: { stacked: true, title: { display: true, text: "grams of fine gold (estimated)" } } },
        plugins: { legend: { position: "bottom" } },
      },
    });
    return () => chart.destroy();
  }, [months]);
  const total = months.reduce((n, m) => n + m.fineGrams, 0);
  return (
    <div className="h-72">
      <canvas ref={canvas} role="img" aria-label={`Estimated fine gold per month by claim, ${total.toFixed(1)} g in all`} />
    </div>
  );
}
