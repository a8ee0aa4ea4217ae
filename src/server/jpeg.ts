import "server-only";

/**
 * A JPEG's dimensions from its frame header, or null when the bytes are not a well-formed
 * JPEG (an HTML page, an SVG, a polyglot with junk before the start-of-image marker).
 */
export function inspectJpeg(buf: Buffer): { width: number; height: number } | null {
  const walked = walkJpeg(buf);
  return walked && walked.width > 0 && walked.height > 0 ? { width: walked.width, height: walked.height } : null;
}

/** The JPEG with only what a picture needs: no EXIF, GPS, XMP, comments or trailing bytes. */
export function stripJpegMetadata(buf: Buffer): Buffer | null {
  return walkJpeg(buf)?.stripped ?? null;
}

const SOI = 0xd8;
const EOI = 0xd9;
const SOS = 0xda;
const isRst = (m: number) => m >= 0xd0 && m <= 0xd7;
const isSof = (m: number) => m >= 0xc0 && m <= 0xcf && m !== 0xc4 && m !== 0xc8 && m !== 0xcc;
/** Segments a decoder needs: tables, frame, restart interval, number of lines, scans. */
const isPictureSegment = (m: number) => isSof(m) || m === 0xc4 || m === 0xcc || m === 0xdb || m === 0xdd || m === 0xdc || m === SOS;

function startsWith(seg: Buffer, signature: string): boolean {
  return seg.length >= signature.length && seg.toString("latin1", 0, signature.length) === signature;
}

/**
 * Application segments kept, none of which can carry a position: the JFIF header and Adobe's
 * colour-transform flag cut to their fixed fields (a JFIF thumbnail, or anything written after
 * the fields, is dropped), and an ICC colour profile. Null: drop the segment.
 */
function keptApplication(marker: number, payload: Buffer): Buffer | null {
  if (marker === 0xe0 && startsWith(payload, "JFIF\0") && payload.length >= JFIF_FIELDS) {
    const fields = Buffer.from(payload.subarray(0, JFIF_FIELDS));
    fields[12] = 0; // thumbnail width
    fields[13] = 0; // thumbnail height
    return fields;
  }
  if (marker === 0xee && startsWith(payload, "Adobe") && payload.length >= ADOBE_FIELDS) return payload.subarray(0, ADOBE_FIELDS);
  if (marker === 0xe2 && startsWith(payload, "ICC_PROFILE\0")) return payload;
  return null;
}
/** "JFIF\0", version, units, densities, thumbnail size: 14 bytes. "Adobe", version, two flags, transform: 12. */
const JFIF_FIELDS = 14;
const ADOBE_FIELDS = 12;

function withLength(marker: number, payload: Buffer): Buffer {
  const head = Buffer.from([0xff, marker, 0, 0]);
  head.writeUInt16BE(payload.length + 2, 2);
  return Buffer.concat([head, payload]);
}

/**
 * Walks every segment of a JPEG, fill bytes and all scans included (progressive files put
 * tables and even metadata between scans), and rebuilds it from the segments a decoder needs.
 * Anything that does not parse as a JPEG is refused (null), never passed through.
 */
function walkJpeg(buf: Buffer): { width: number; height: number; stripped: Buffer } | null {
  if (buf.length < 4 || buf[0] !== 0xff || buf[1] !== SOI) return null;
  const out: Buffer[] = [buf.subarray(0, 2)];
  let width = 0;
  let height = 0;
  let i = 2;
  for (;;) {
    // A marker is 0xFF, any number of 0xFF fill bytes, then its code.
    if (i >= buf.length || buf[i] !== 0xff) return null;
    while (i < buf.length && buf[i] === 0xff) i++;
    if (i >= buf.length) return null;
    const marker = buf[i];
    i++;
    if (marker === EOI) {
      if (width === 0) return null;
      out.push(Buffer.from([0xff, EOI]));
      return { width, height, stripped: Buffer.concat(out) };
    }
    if (marker === 0x00 || marker === SOI || isRst(marker) || marker === 0x01) return null;
    if (i + 2 > buf.length) return null;
    const length = buf.readUInt16BE(i);
    if (length < 2 || i + length > buf.length) return null;
    const segment = buf.subarray(i - 2, i + length);
    const payload = buf.subarray(i + 2, i + length);
    i += length;
    if (isSof(marker)) {
      if (payload.length < 5 || width !== 0) return null;
      height = payload.readUInt16BE(1);
      width = payload.readUInt16BE(3);
    }
    if (isPictureSegment(marker)) out.push(Buffer.concat([Buffer.from([0xff, marker]), segment.subarray(2)]));
    else if (marker >= 0xe0 && marker <= 0xef) {
      const kept = keptApplication(marker, payload);
      if (kept) out.push(withLength(marker, kept));
    }
    if (marker === SOS) {
      if (width === 0) return null; // scan data before any frame header
      // Entropy-coded data runs to the next marker that is not a stuffed zero or a restart.
      const start = i;
      while (i + 1 < buf.length && !(buf[i] === 0xff && buf[i + 1] !== 0x00 && !isRst(buf[i + 1]) && buf[i + 1] !== 0xff)) i++;
      if (i + 1 >= buf.length) return null;
      out.push(buf.subarray(start, i));
    }
  }
}
