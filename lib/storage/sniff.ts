import { inflateSync } from "node:zlib";

/**
 * Image type from the file's content, never from its name or the browser's claim. Only raster formats
 * browsers show as images: no SVG (it can carry script), no HTML. A signature alone is not enough: PNG and
 * JPEG files are walked chunk by chunk / segment by segment (PNG: IHDR first, CRCs, IDAT that inflates to
 * the size IHDR promises, IEND last; JPEG: a frame header, a scan, EOI at the end), so eight signature
 * bytes followed by HTML are refused. GIF and WebP get their trailer / RIFF length checked.
 */
export type ImageType = { contentType: "image/jpeg" | "image/png" | "image/gif" | "image/webp"; ext: "jpg" | "png" | "gif" | "webp" };

// Larger photos are not inspection photos; the bound also caps what a PNG may inflate to.
const MAX_PIXELS = 60_000_000;

export function sniffImage(b: Uint8Array): ImageType | null {
  const at = (i: number, bytes: number[]) => bytes.every((v, k) => b[i + k] === v);
  if (b.length >= 3 && at(0, [0xff, 0xd8, 0xff])) return isJpeg(b) ? { contentType: "image/jpeg", ext: "jpg" } : null;
  if (b.length >= 8 && at(0, PNG_SIGNATURE)) return isPng(b) ? { contentType: "image/png", ext: "png" } : null;
  if (b.length >= 14 && (at(0, [0x47, 0x49, 0x46, 0x38, 0x37, 0x61]) || at(0, [0x47, 0x49, 0x46, 0x38, 0x39, 0x61])) && b[b.length - 1] === 0x3b)
    return { contentType: "image/gif", ext: "gif" };
  if (b.length >= 20 && at(0, [0x52, 0x49, 0x46, 0x46]) && at(8, [0x57, 0x45, 0x42, 0x50]) && u32le(b, 4) + 8 === b.length)
    return { contentType: "image/webp", ext: "webp" };
  return null;
}

const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
const u32 = (b: Uint8Array, i: number) => ((b[i] << 24) | (b[i + 1] << 16) | (b[i + 2] << 8) | b[i + 3]) >>> 0;
const u16 = (b: Uint8Array, i: number) => (b[i] << 8) | b[i + 1];
const u32le = (b: Uint8Array, i: number) => (b[i] | (b[i + 1] << 8) | (b[i + 2] << 16) | (b[i + 3] << 24)) >>> 0;

// Source: PNG specification (W3C, 2nd ed.), §5.3 chunk layout, §11.2.2 IHDR, Annex D CRC-32.
const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

function crc32(b: Uint8Array, from: number, to: number): number {
  let c = 0xffffffff;
  for (let i = from; i < to; i++) c = CRC_TABLE[(c ^ b[i]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

const CHANNELS: Record<number, number> = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 };

function isPng(b: Uint8Array): boolean {
  let i = 8;
  let header: { width: number; height: number; bitsPerPixel: number; interlaced: boolean } | null = null;
  const idat: Uint8Array[] = [];
  let first = true;
  while (i + 12 <= b.length) {
    const length = u32(b, i);
    const type = String.fromCharCode(b[i + 4], b[i + 5], b[i + 6], b[i + 7]);
    const end = i + 12 + length;
    if (length > 0x7fffffff || end > b.length || !/^[A-Za-z]{4}$/.test(type)) return false;
    if (crc32(b, i + 4, i + 8 + length) !== u32(b, i + 8 + length)) return false;
    const data = b.subarray(i + 8, i + 8 + length);
    if (first !== (type === "IHDR")) return false;
    first = false;
    if (type === "IHDR") {
      if (length !== 13) return false;
      const [width, height, depth, colour, , , interlace] = [u32(data, 0), u32(data, 4), data[8], data[9], data[10], data[11], data[12]];
      if (!width || !height || width * height > MAX_PIXELS || !(colour in CHANNELS) || ![1, 2, 4, 8, 16].includes(depth) || interlace > 1) return false;
      header = { width, height, bitsPerPixel: depth * CHANNELS[colour], interlaced: interlace === 1 };
    } else if (type === "IDAT") idat.push(data);
    else if (type === "IEND") return end === b.length && !!header && idat.length > 0 && idatInflates(idat, header);
    i = end;
  }
  return false;
}

function idatInflates(parts: Uint8Array[], h: { width: number; height: number; bitsPerPixel: number; interlaced: boolean }): boolean {
  // Each row: a filter byte and its packed pixels. Interlaced images have seven smaller passes, never more.
  const rowBytes = 1 + Math.ceil((h.width * h.bitsPerPixel) / 8);
  const expected = h.height * rowBytes;
  try {
    const raw = inflateSync(Buffer.concat(parts), { maxOutputLength: expected + 7 * (h.height + 8) + 1024 });
    return h.interlaced ? raw.length > 0 : raw.length === expected;
  } catch {
    return false;
  }
}

// Source: ITU-T T.81 (JPEG), Annex B: marker segments with big-endian lengths; SOFn, SOS, EOI.
function isJpeg(b: Uint8Array): boolean {
  let i = 2;
  let frame = false;
  while (i + 4 <= b.length) {
    if (b[i] !== 0xff) return false;
    const marker = b[i + 1];
    if (marker === 0xff) {
      i += 1; // fill byte
      continue;
    }
    if (marker === 0xd8 || marker === 0xd9 || (marker >= 0xd0 && marker <= 0xd7) || marker === 0x01) return false;
    const length = u16(b, i + 2);
    if (length < 2 || i + 2 + length > b.length) return false;
    const isSof = marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc;
    if (isSof) {
      if (length < 8) return false;
      const height = u16(b, i + 5);
      const width = u16(b, i + 7);
      if (!width || !height || width * height > MAX_PIXELS) return false;
      frame = true;
    }
    if (marker === 0xda) return frame && scanEndsWithEoi(b, i + 2 + length);
    i += 2 + length;
  }
  return false;
}

/** Entropy-coded data (0xFF is always followed by 0x00, a restart marker or another marker) up to EOI. */
function scanEndsWithEoi(b: Uint8Array, from: number): boolean {
  for (let i = from; i + 1 < b.length; i++) {
    if (b[i] !== 0xff) continue;
    const next = b[i + 1];
    if (next === 0x00 || next === 0xff || (next >= 0xd0 && next <= 0xd7)) continue;
    if (next === 0xd9) return b.subarray(i + 2).every((x) => x === 0x00);
    // Another marker: a progressive JPEG's next table or scan; walk its segment and carry on.
    if (i + 3 >= b.length) return false;
    const length = u16(b, i + 2);
    if (length < 2) return false;
    i += 1 + length;
  }
  return false;
}
