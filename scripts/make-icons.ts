import fs from "node:fs";
import { chromium } from "playwright-core";

// Renders our mark to the PNG icons the manifest lists (run once when the mark changes).
const mark = (size: number, pad: number) => `
<svg xmlns="http://www.w3.org/2000/svg" width="${size}" height="${size}" viewBox="0 0 32 32">
  <rect width="32" height="32" fill="#8f430f"/>
  <g transform="translate(${pad} ${pad}) scale(${(32 - 2 * pad) / 32})">
    <path d="M3 7c4-1.5 8-1.5 12 0v19c-4-1.5-8-1.5-12 0z" fill="#fffdf7"/>
    <path d="M17 7c4-1.5 8-1.5 12 0v19c-4-1.5-8-1.5-12 0z" fill="#fffdf7"/>
    <path d="M6 11h6M6 14h6M6 17h6M6 20h5" stroke="#c9bda3" stroke-width="0.9"/>
    <path d="M19.2 16.5c1.2-2.6 5.4-3.2 6.6-1 1.1 2-.6 4.8-3.4 4.8-2.4 0-4.1-1.6-3.2-3.8z" fill="#e0aa22" stroke="#14120f" stroke-width="0.8"/>
  </g>
</svg>`;

const browser = await chromium.launch({ executablePath: "/usr/bin/chromium", args: ["--no-sandbox", "--disable-gpu"] });
const page = await browser.newPage();
for (const [name, size, pad] of [
  ["icon-192", 192, 0],
  ["icon-512", 512, 0],
  ["icon-maskable-512", 512, 4],
] as const) {
  await page.setViewportSize({ width: size, height: size });
  await page.setContent(`<html><body style="margin:0">${mark(size, pad)}</body></html>`);
  fs.writeFileSync(`public/icons/${name}.png`, await page.screenshot({ clip: { x: 0, y: 0, width: size, height: size } }));
}
await browser.close();
