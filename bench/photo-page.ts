// Bundled into a Chromium page by the bench (esbuild, iife `lodebookBenchPhotos`): the painted
// originals are encoded by Chromium, as a phone's camera output reaches the app, and shrunk by
// the app's own code.
import { shrinkImage } from "../src/client/photos";
import { paintSpecimenPhoto } from "./specimen-photo";

export { shrinkImage };

/** A 12 MP "camera" JPEG of a painted specimen (quality 0.92, as phone cameras save). */
export async function cameraJpeg(seed: number, width = 4000, height = 3000): Promise<Blob> {
  const canvas = new OffscreenCanvas(width, height);
  const ctx = canvas.getContext("2d")!;
  ctx.putImageData(new ImageData(paintSpecimenPhoto(width, height, seed) as Uint8ClampedArray<ArrayBuffer>, width, height), 0, 0);
  return canvas.convertToBlob({ type: "image/jpeg", quality: 0.92 });
}

/** The same picture shifted by a few pixels and re-encoded: another shot of the specimen, cheaply. */
export async function anotherShot(original: Blob, k: number): Promise<Blob> {
  const bitmap = await createImageBitmap(original);
  const canvas = new OffscreenCanvas(bitmap.width, bitmap.height);
  const ctx = canvas.getContext("2d")!;
  ctx.fillStyle = "#a08860";
  ctx.fillRect(0, 0, bitmap.width, bitmap.height);
  ctx.drawImage(bitmap, (k % 5) * 7 - 14, Math.floor(k / 5) * 5 - 10);
  bitmap.close();
  return canvas.convertToBlob({ type: "image/jpeg", quality: 0.92 });
}

/** Luma of a picture drawn at `width`×`height` with the browser's best resampling (as a phone shows it). */
async function lumaAt(source: Blob, width: number, height: number): Promise<Float32Array> {
  const bitmap = await createImageBitmap(source);
  const canvas = new OffscreenCanvas(width, height);
  const ctx = canvas.getContext("2d")!;
  ctx.imageSmoothingQuality = "high";
  ctx.drawImage(bitmap, 0, 0, width, height);
  bitmap.close();
  const rgba = ctx.getImageData(0, 0, width, height).data;
  const y = new Float32Array(width * height);
  for (let i = 0; i < y.length; i++) y[i] = 0.299 * rgba[i * 4] + 0.587 * rgba[i * 4 + 1] + 0.114 * rgba[i * 4 + 2];
  return y;
}

/**
 * Mean SSIM (Wang, Bovik, Sheikh & Simoncelli 2004, constants K1 = 0.01, K2 = 0.03, L = 255)
 * over 8×8 windows at a stride of 4, on luma, inside the specimen's part of the frame (the
 * middle 56 % × 76 %: what a member or an officer looks at).
 */
function ssim(a: Float32Array, b: Float32Array, width: number, height: number): number {
  const c1 = (0.01 * 255) ** 2;
  const c2 = (0.03 * 255) ** 2;
  let sum = 0;
  let count = 0;
  for (let y0 = Math.floor(height * 0.12); y0 + 8 <= height * 0.88; y0 += 4) {
    for (let x0 = Math.floor(width * 0.22); x0 + 8 <= width * 0.78; x0 += 4) {
      let ma = 0;
      let mb = 0;
      for (let y = y0; y < y0 + 8; y++)
        for (let x = x0; x < x0 + 8; x++) {
          ma += a[y * width + x];
          mb += b[y * width + x];
        }
      ma /= 64;
      mb /= 64;
      let va = 0;
      let vb = 0;
      let cov = 0;
      for (let y = y0; y < y0 + 8; y++)
        for (let x = x0; x < x0 + 8; x++) {
          const da = a[y * width + x] - ma;
          const db = b[y * width + x] - mb;
          va += da * da;
          vb += db * db;
          cov += da * db;
        }
      va /= 63;
      vb /= 63;
      cov /= 63;
      sum += ((2 * ma * mb + c1) * (2 * cov + c2)) / ((ma * ma + mb * mb + c1) * (va + vb + c2));
      count++;
    }
  }
  return sum / count;
}

export type StudyRow = { edge: number; quality: number; bytes: number; ssimPhone: number; ssimZoom: number };

/**
 * Each (long edge, quality) pair on one original: the shrunk JPEG's bytes, and its SSIM against
 * the original, both drawn at a phone's full-screen size (1170 px long edge: a 390-point-wide
 * phone at 3× density) and pinch-zoomed 2× to look at the gold (2340 px).
 */
export async function studyOriginal(original: Blob, pairs: [number, number][]): Promise<StudyRow[]> {
  const bitmap = await createImageBitmap(original);
  const aspect = bitmap.height / bitmap.width;
  bitmap.close();
  const views = [1170, 2340].map((w) => ({ w, h: Math.round(w * aspect) }));
  const refs = await Promise.all(views.map((v) => lumaAt(original, v.w, v.h)));
  const rows: StudyRow[] = [];
  for (const [edge, quality] of pairs) {
    const { blob } = await shrinkImage(original, edge, quality);
    const scores = [];
    for (let k = 0; k < views.length; k++) scores.push(ssim(refs[k], await lumaAt(blob, views[k].w, views[k].h), views[k].w, views[k].h));
    rows.push({ edge, quality, bytes: blob.size, ssimPhone: scores[0], ssimZoom: scores[1] });
  }
  return rows;
}
