import { seededRandom } from "../src/lib/estimate/uncertainty";

/**
 * A photograph of a gold-in-quartz specimen on sand, painted from a seed: what a member's phone
 * takes, so that an encoder's figure on it means something. It has what real photographs have
 * and noise has not: smooth areas (lighting, the milky quartz body, a soft shadow), sharp edges
 * (the specimen's outline, dark veins, a ruler with tick marks), fine texture (sugary quartz
 * grain, sand), gold specks and flakes with hard edges and highlights, iron staining, and a
 * little sensor noise. Deterministic: the same seed paints the same pixels in Node and Chromium.
 */
export function paintSpecimenPhoto(width: number, height: number, seed: number): Uint8ClampedArray {
  const rand = seededRandom(seed);
  const out = new Uint8ClampedArray(width * height * 4);
  const s = Math.min(width, height) / 3000; // features scale with the picture: 1 at 12 MP
  const light = valueNoise(width, height, 420 * s, rand);
  const mottle = valueNoise(width, height, 70 * s, rand);
  const grain = valueNoise(width, height, Math.max(2, 9 * s), rand);
  const fine = valueNoise(width, height, Math.max(1.2, 2.6 * s), rand);
  const stain = valueNoise(width, height, 160 * s, rand);

  const cx = width * (0.45 + rand() * 0.1);
  const cy = height * (0.45 + rand() * 0.08);
  const radius = height * (0.3 + rand() * 0.05);
  const waves = [
    [3, 0.13, rand() * 6.28],
    [5, 0.07, rand() * 6.28],
    [11, 0.035, rand() * 6.28],
    [23, 0.012, rand() * 6.28],
  ];
  const edgeAt = (angle: number) => radius * (1 + waves.reduce((n, [k, a, p]) => n + a * Math.sin(k * angle + p), 0));
  const veins = Array.from({ length: 3 }, () => {
    const a = rand() * Math.PI;
    const off = (rand() - 0.5) * radius;
    return { nx: Math.cos(a), ny: Math.sin(a), off, half: (2 + rand() * 5) * s };
  });
  const sand = [186 + rand() * 20, 160 + rand() * 15, 118 + rand() * 15];
  const shadowDx = 40 * s;
  const shadowDy = 55 * s;

  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = y * width + x;
      const lit = 0.78 + 0.3 * light(x, y) - 0.18 * (((x - width / 2) / width) ** 2 + ((y - height / 2) / height) ** 2) * 2;
      const dx = x - cx;
      const dy = y - cy;
      const dist = Math.sqrt(dx * dx + dy * dy);
      const edge = edgeAt(Math.atan2(dy, dx));
      const inside = Math.min(1, Math.max(0, edge - dist + 0.5)); // one pixel of antialiasing
      let r: number;
      let g: number;
      let b: number;
      {
        // Sand: mottled, grainy, darkened under the specimen's soft shadow.
        const sx = x - cx - shadowDx;
        const sy = y - cy - shadowDy;
        const sr = Math.sqrt(sx * sx + sy * sy);
        const sd = inside >= 1 || sr > radius * 1.3 + 90 * s ? 1e9 : sr - edgeAt(Math.atan2(sy, sx));
        const shade = 1 - 0.45 * Math.min(1, Math.max(0, 1 - sd / (90 * s)));
        const t = (0.85 + 0.2 * mottle(x, y) + 0.22 * grain(x, y) + 0.18 * fine(x, y)) * lit * shade;
        r = sand[0] * t;
        g = sand[1] * t;
        b = sand[2] * t;
      }
      if (inside > 0) {
        // Milky quartz: a dome lit from the upper left, sugary grain, iron staining, dark veins.
        const h = Math.max(0, 1 - (dist / edge) ** 2);
        const dome = 0.62 + 0.38 * Math.sqrt(h) - 0.16 * ((dx + dy) / (edge * 1.5));
        const q = (0.9 + 0.12 * mottle(x * 1.7, y * 1.7) + 0.1 * grain(x, y) + 0.08 * fine(x, y)) * dome * lit;
        let qr = 226 * q;
        let qg = 222 * q;
        let qb = 214 * q;
        const iron = Math.min(1, Math.max(0, (stain(x, y) - 0.25) * 3));
        qr = qr * (1 - iron * 0.35) + 150 * iron * 0.35 * q;
        qg = qg * (1 - iron * 0.5) + 80 * iron * 0.5 * q;
        qb = qb * (1 - iron * 0.65) + 35 * iron * 0.65 * q;
        for (const v of veins) {
          const d = Math.abs(dx * v.nx + dy * v.ny - v.off);
          const cover = Math.min(1, Math.max(0, v.half - d + 0.5)) * 0.75;
          qr *= 1 - cover;
          qg *= 1 - cover;
          qb *= 1 - cover * 0.9;
        }
        r = r * (1 - inside) + qr * inside;
        g = g * (1 - inside) + qg * inside;
        b = b * (1 - inside) + qb * inside;
      }
      out[i * 4] = r;
      out[i * 4 + 1] = g;
      out[i * 4 + 2] = b;
      out[i * 4 + 3] = 255;
    }
  }

  // Gold: specks and a few flakes inside the specimen, hard-edged, with a highlight.
  const specks = 70 + Math.floor(rand() * 40);
  for (let k = 0; k < specks; k++) {
    const a = rand() * Math.PI * 2;
    const d = Math.sqrt(rand()) * radius * 0.85;
    const px = cx + Math.cos(a) * d;
    const py = cy + Math.sin(a) * d;
    const size = (k < 6 ? 18 + rand() * 30 : 1.5 + rand() ** 2 * 12) * s;
    paintSpeck(out, width, height, px, py, size, rand);
  }
  paintRuler(out, width, height, s);
  // Sensor noise: small, as a phone's denoised output keeps.
  let n = seed >>> 0;
  for (let i = 0; i < out.length; i += 4) {
    n = (n * 1664525 + 1013904223) >>> 0;
    const e = ((n >>> 24) / 255 - 0.5) * 5;
    out[i] += e;
    out[i + 1] += e;
    out[i + 2] += e;
  }
  return out;
}

function paintSpeck(out: Uint8ClampedArray, width: number, height: number, px: number, py: number, size: number, rand: () => number) {
  const lobes = 2 + Math.floor(rand() * 3);
  const phase = rand() * 6.28;
  const rough = 0.12 + rand() * 0.2;
  const lobes2 = 5 + Math.floor(rand() * 5);
  const phase2 = rand() * 6.28;
  const reach = Math.ceil(size * (1 + rough * 1.5) + 2);
  for (let y = Math.max(0, Math.floor(py - reach)); y < Math.min(height, py + reach); y++) {
    for (let x = Math.max(0, Math.floor(px - reach)); x < Math.min(width, px + reach); x++) {
      const dx = x - px;
      const dy = y - py;
      const d = Math.sqrt(dx * dx + dy * dy);
      const angle = Math.atan2(dy, dx);
      const edge = size * (1 + rough * Math.sin(lobes * angle + phase) + rough * 0.5 * Math.sin(lobes2 * angle + phase2));
      const cover = Math.min(1, Math.max(0, edge - d + 0.5));
      if (cover <= 0) continue;
      // Brighter toward the upper left (the light), with a hot spot.
      const t = 0.75 + 0.35 * Math.max(0, -(dx + dy) / (edge * 1.6 + 1)) + (d < edge * 0.25 ? 0.25 : 0);
      const i = (y * width + x) * 4;
      out[i] = out[i] * (1 - cover) + Math.min(255, 214 * t) * cover;
      out[i + 1] = out[i + 1] * (1 - cover) + Math.min(255, 168 * t) * cover;
      out[i + 2] = out[i + 2] * (1 - cover) + Math.min(255, 52 * t) * cover;
    }
  }
}

/** A white ruler along the bottom with black millimetre ticks: the sharpest edges in the picture. */
function paintRuler(out: Uint8ClampedArray, width: number, height: number, s: number) {
  const top = Math.floor(height * 0.9);
  const bottom = Math.floor(height * 0.97);
  const left = Math.floor(width * 0.08);
  const right = Math.floor(width * 0.7);
  const mm = 11 * s;
  for (let y = top; y < bottom; y++) {
    for (let x = left; x < right; x++) {
      const i = (y * width + x) * 4;
      const along = (x - left) / mm;
      const k = Math.round(along);
      const tick = Math.abs(along - k) * mm < 1.2 * s && y - top < (k % 10 === 0 ? 0.6 : k % 5 === 0 ? 0.45 : 0.3) * (bottom - top);
      const v = tick ? 25 : 238 - ((y - top) / (bottom - top)) * 20;
      out[i] = v;
      out[i + 1] = v;
      out[i + 2] = tick ? 25 : v - 4;
    }
  }
}

/** Smooth value noise in [−0.5, 0.5]: random values on a lattice of `cell` px, eased between. */
function valueNoise(width: number, height: number, cell: number, rand: () => number): (x: number, y: number) => number {
  const gw = Math.ceil((width * 1.8) / cell) + 2;
  const gh = Math.ceil((height * 1.8) / cell) + 2;
  const grid = new Float32Array(gw * gh);
  for (let i = 0; i < grid.length; i++) grid[i] = rand() - 0.5;
  return (x, y) => {
    const fx = x / cell;
    const fy = y / cell;
    const ix = Math.min(gw - 2, Math.floor(fx));
    const iy = Math.min(gh - 2, Math.floor(fy));
    let tx = fx - ix;
    let ty = fy - iy;
    tx = tx * tx * (3 - 2 * tx);
    ty = ty * ty * (3 - 2 * ty);
    const o = iy * gw + ix;
    const top = grid[o] + (grid[o + 1] - grid[o]) * tx;
    const bottom = grid[o + gw] + (grid[o + gw + 1] - grid[o + gw]) * tx;
    return top + (bottom - top) * ty;
  };
}
