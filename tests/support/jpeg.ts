import jpeg from "jpeg-js";
import piexif from "piexifjs";

/** Degrees as EXIF rationals: degrees, minutes, seconds × 1000. */
function rational(value: number): [number, number][] {
  const abs = Math.abs(value);
  const d = Math.floor(abs);
  const m = Math.floor((abs - d) * 60);
  const s = Math.round(((abs - d) * 60 - m) * 60 * 1000);
  return [
    [d, 1],
    [m, 1],
    [s, 1000],
  ];
}

const pad = (n: number) => String(n).padStart(2, "0");

/**
 * A real JPEG made here (a colour gradient), with EXIF GPS and capture time when asked:
 * the test photos are ours, not downloaded.
 */
export function makeJpeg(opts: { width: number; height: number; lat?: number; lon?: number; takenAt?: Date; quality?: number }): Buffer {
  const { width, height } = opts;
  const data = Buffer.alloc(width * height * 4);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 4;
      data[i] = (x * 255) / width;
      data[i + 1] = (y * 255) / height;
      data[i + 2] = ((x ^ y) & 0xff) / 2;
      data[i + 3] = 255;
    }
  }
  const encoded = jpeg.encode({ data, width, height }, opts.quality ?? 90).data;
  if (opts.lat === undefined && !opts.takenAt) return Buffer.from(encoded);
  const exif: Record<string, Record<number, unknown>> = { "0th": {}, Exif: {}, GPS: {} };
  if (opts.takenAt) {
    const t = opts.takenAt;
    exif.Exif[piexif.ExifIFD.DateTimeOriginal] =
      `${t.getFullYear()}:${pad(t.getMonth() + 1)}:${pad(t.getDate())} ${pad(t.getHours())}:${pad(t.getMinutes())}:${pad(t.getSeconds())}`;
  }
  if (opts.lat !== undefined && opts.lon !== undefined) {
    exif.GPS[piexif.GPSIFD.GPSLatitudeRef] = opts.lat >= 0 ? "N" : "S";
    exif.GPS[piexif.GPSIFD.GPSLatitude] = rational(opts.lat);
    exif.GPS[piexif.GPSIFD.GPSLongitudeRef] = opts.lon >= 0 ? "E" : "W";
    exif.GPS[piexif.GPSIFD.GPSLongitude] = rational(opts.lon);
  }
  const withExif = piexif.insert(piexif.dump(exif), Buffer.from(encoded).toString("binary"));
  return Buffer.from(withExif, "binary");
}
