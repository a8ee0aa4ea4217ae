import "server-only";
import zlib from "node:zlib";

// A PNG writer for invented tiles (PNG specification, W3C 2003, §5–§11): an indexed-colour
// image (colour type 3, 8 bits), its palette, one IDAT and no filtering. Posterised shading
// in a small palette compresses to a few kB a tile.

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});

function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Uint8Array): Buffer {
  const body = Buffer.concat([Buffer.from(type, "latin1"), data]);
  const out = Buffer.alloc(8 + data.length + 4);
  out.writeUInt32BE(data.length, 0);
  body.copy(out, 4);
  out.writeUInt32BE(crc32(body), 8 + data.length);
  return out;
}

export type Rgb = readonly [number, number, number];

/** `pixels` holds one palette index per pixel, row by row. */
export function encodeIndexedPng(width: number, height: number, palette: readonly Rgb[], pixels: Uint8Array): Buffer {
  if (palette.length === 0 || palette.length > 256) throw new RangeError("a PNG palette holds 1 to 256 colours");
  if (pixels.length !== width * height) throw new RangeError("one palette index per pixel");
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header[8] = 8; // bit depth
  header[9] = 3; // indexed colour
  const rows = Buffer.alloc((width + 1) * height);
  for (let y = 0; y < height; y++) rows.set(pixels.subarray(y * width, (y + 1) * width), y * (width + 1) + 1); // filter byte 0: none
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", header),
    chunk("PLTE", Uint8Array.from(palette.flat())),
    chunk("IDAT", zlib.deflateSync(rows, { level: 9 })),
    chunk("IEND", new Uint8Array(0)),
  ]);
}

/** A tile of one colour (tests). */
export function solidPng(colour: Rgb, size = 256): Buffer {
  return encodeIndexedPng(size, size, [colour], new Uint8Array(size * size));
}
