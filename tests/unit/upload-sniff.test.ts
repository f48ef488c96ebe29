import { describe, expect, it } from "vitest";
import { sniffImage } from "@/lib/storage/sniff";
import { downloadHeaders, safeName } from "@/lib/logbook/uploads";

// A valid 1×1 RGBA PNG.
const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==", "base64");
// A baseline 8×8 grey JPEG: SOI, DQT, SOF0, DC and AC Huffman tables of one code each, SOS, one block
// (DC difference 0, end of block), EOI.
const JPEG = Buffer.from(
  [
    [0xff, 0xd8],
    [0xff, 0xdb, 0x00, 0x43, 0x00, ...Array(64).fill(1)],
    [0xff, 0xc0, 0x00, 0x0b, 0x08, 0x00, 0x08, 0x00, 0x08, 0x01, 0x01, 0x11, 0x00],
    [0xff, 0xc4, 0x00, 0x14, 0x00, 0x01, ...Array(15).fill(0), 0x00],
    [0xff, 0xc4, 0x00, 0x14, 0x10, 0x01, ...Array(15).fill(0), 0x00],
    [0xff, 0xda, 0x00, 0x08, 0x01, 0x01, 0x00, 0x00, 0x3f, 0x00],
    [0x3f],
    [0xff, 0xd9],
  ].flat(),
);
// A 1×1 GIF89a.
const GIF = Buffer.from("R0lGODlhAQABAIAAAAAAAP///yH5BAEAAAAALAAAAAABAAEAAAIBRAA7", "base64");
const webpBody = Buffer.from("WEBPVP8L\x0a\x00\x00\x00\x2f\x00\x00\x00\x10\x07\x10\x11\x11\x88", "latin1");
const WEBP = Buffer.concat([Buffer.from("RIFF"), Buffer.from(Uint32Array.of(webpBody.length).buffer), webpBody]);

describe("image check by content", () => {
  // Source: the formats' signatures and layouts — PNG (W3C PNG spec §5: signature, IHDR first, CRC-32 per
  // chunk, IEND last), JPEG (ITU-T T.81 Annex B: SOI, SOFn, DHT, SOS, EOI), GIF89a trailer 0x3B, RIFF length.
  it("knows PNG, JPEG, GIF and WebP by their content", () => {
    expect(sniffImage(PNG)?.contentType).toBe("image/png");
    expect(sniffImage(JPEG)?.contentType).toBe("image/jpeg");
    expect(sniffImage(GIF)?.contentType).toBe("image/gif");
    expect(sniffImage(WEBP)?.contentType).toBe("image/webp");
  });

  it("refuses a signature that is not followed by a real image", () => {
    const html = Buffer.from("<!doctype html><script>alert(1)</script>");
    expect(sniffImage(PNG.subarray(0, 8))).toBeNull();
    expect(sniffImage(Buffer.concat([PNG.subarray(0, 8), html]))).toBeNull();
    expect(sniffImage(Buffer.concat([PNG, html]))).toBeNull();
    expect(sniffImage(Buffer.from([0xff, 0xd8, 0xff, 0xe0]))).toBeNull();
    expect(sniffImage(Buffer.concat([Buffer.from([0xff, 0xd8, 0xff]), html]))).toBeNull();
    expect(sniffImage(JPEG.subarray(0, JPEG.length - 2))).toBeNull();
    expect(sniffImage(Buffer.from("GIF89a...."))).toBeNull();
    // One flipped bit inside the IHDR chunk breaks its CRC.
    const bad = Buffer.from(PNG);
    bad[20] ^= 1;
    expect(sniffImage(bad)).toBeNull();
  });

  it("refuses HTML, SVG and a text file named like an image", () => {
    expect(sniffImage(Buffer.from("<!doctype html><script>alert(1)</script>"))).toBeNull();
    expect(sniffImage(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"/>'))).toBeNull();
    expect(sniffImage(Buffer.from("just text, saved as photo.jpg"))).toBeNull();
  });

  it("serves photos as images that are never run, and other files as downloads", () => {
    const h = downloadHeaders({ id: 7, kind: "photo", contentType: "image/png", bytes: 70 });
    expect(h["Content-Type"]).toBe("image/png");
    expect(h["X-Content-Type-Options"]).toBe("nosniff");
    expect(h["Content-Security-Policy"]).toContain("sandbox");
    expect(h["Content-Disposition"]).toBe('inline; filename="photo-7.png"');
    expect(downloadHeaders({ id: 8, kind: "recording", contentType: "text/csv", bytes: 10 })["Content-Disposition"]).toBe('attachment; filename="recording-8.csv"');
  });

  it("keeps only a harmless display name", () => {
    expect(safeName('../../etc/"passwd"\n')).toBe(".._.._etc__passwd__");
  });
});
