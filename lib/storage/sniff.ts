/**
 * Image type from the file's first bytes (magic numbers), never from its name or the browser's claim.
 * Only raster formats browsers show as images: no SVG (it can carry script), no HTML.
 */
export type ImageType = { contentType: "image/jpeg" | "image/png" | "image/gif" | "image/webp"; ext: "jpg" | "png" | "gif" | "webp" };

export function sniffImage(b: Uint8Array): ImageType | null {
  const at = (i: number, bytes: number[]) => bytes.every((v, k) => b[i + k] === v);
  if (b.length >= 3 && at(0, [0xff, 0xd8, 0xff])) return { contentType: "image/jpeg", ext: "jpg" };
  if (b.length >= 8 && at(0, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return { contentType: "image/png", ext: "png" };
  if (b.length >= 6 && (at(0, [0x47, 0x49, 0x46, 0x38, 0x37, 0x61]) || at(0, [0x47, 0x49, 0x46, 0x38, 0x39, 0x61]))) return { contentType: "image/gif", ext: "gif" };
  if (b.length >= 12 && at(0, [0x52, 0x49, 0x46, 0x46]) && at(8, [0x57, 0x45, 0x42, 0x50])) return { contentType: "image/webp", ext: "webp" };
  return null;
}
