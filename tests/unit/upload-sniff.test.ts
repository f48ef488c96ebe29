import { describe, expect, it } from "vitest";
import { sniffImage } from "@/lib/storage/sniff";
import { downloadHeaders, safeName } from "@/lib/logbook/uploads";

describe("image check by content", () => {
  // Source: the formats' signatures — PNG (RFC 2083 §3.1), JPEG SOI FF D8 FF, GIF87a/89a, RIFF….WEBP.
  it("knows PNG, JPEG, GIF and WebP by their first bytes", () => {
    expect(sniffImage(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0]))?.contentType).toBe("image/png");
    expect(sniffImage(Buffer.from([0xff, 0xd8, 0xff, 0xe0]))?.contentType).toBe("image/jpeg");
    expect(sniffImage(Buffer.from("GIF89a...."))?.contentType).toBe("image/gif");
    expect(sniffImage(Buffer.from("RIFF\x10\x00\x00\x00WEBPVP8 "))?.contentType).toBe("image/webp");
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
