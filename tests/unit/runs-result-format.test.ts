import { describe, expect, it } from "vitest";
import { gunzipSync } from "node:zlib";
import { decodeResult, encodeResult, RESULT_FORMAT, ResultFormatError } from "@/lib/runs/result-format";

// The result container is our own format (lib/runs/result-format.ts); these checks follow its layout.
describe("tautline-result/1 container", () => {
  const t = Float64Array.from({ length: 200 }, (_, i) => i * 0.05);
  const sample = {
    series: { t, speed: t.map((x) => 2.5 * Math.sin(x)), labels: ["t", "speed"] },
    frames: { t: Float64Array.from([0, 1, 2]), tension: [Float32Array.from([1, 2, 3, 4, 5, 6, 7, 8])] },
    notes: [{ t: 1.5, text: "pick-up" }],
    steps: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10],
    count: 3,
  };

  it("round-trips structure, strings and numbers; floats at f32 precision", () => {
    const blob = encodeResult(sample);
    const out = decodeResult(blob) as {
      series: { t: Float32Array; speed: Float32Array; labels: string[] };
      frames: { tension: Float32Array[] };
      notes: unknown;
      steps: Float64Array;
      count: number;
    };
    expect(out.series.labels).toEqual(["t", "speed"]);
    expect(out.notes).toEqual(sample.notes);
    expect(out.count).toBe(3);
    expect(out.series.t).toBeInstanceOf(Float32Array);
    expect(out.series.t.length).toBe(200);
    for (let i = 0; i < 200; i++) {
      // f32 keeps 24 bits of mantissa: relative error below 2^-24 ≈ 6e-8 (IEEE 754 binary32).
      expect(Math.abs(out.series.speed[i]! - sample.series.speed[i]!)).toBeLessThanOrEqual(Math.abs(sample.series.speed[i]!) * 6e-8 + 1e-12);
    }
    expect(Array.from(out.frames.tension[0]!)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    // Whole-number arrays are kept exactly (f64).
    expect(Array.from(out.steps)).toEqual(sample.steps);
  });

  it("documents its layout: gzip around magic TLR1, a header length and a JSON header", () => {
    const raw = gunzipSync(encodeResult(sample));
    expect(raw.toString("latin1", 0, 4)).toBe("TLR1");
    const h = raw.readUInt32LE(4);
    const header = JSON.parse(raw.toString("utf8", 8, 8 + h));
    expect(header.format).toBe(RESULT_FORMAT);
    expect(header.value.series.t).toEqual({ $array: 0 });
    expect(header.arrays[0]).toEqual({ dtype: "f32", length: 200, offset: 0 });
    for (const a of header.arrays) expect(a.offset % 8).toBe(0);
    // 200 f32 values + 200 f32 values + small arrays: the data section is at least 1600 bytes.
    expect(raw.byteLength).toBeGreaterThan(8 + h + 1600);
  });

  it("gives plain arrays rounded to 7 significant digits for JSON", () => {
    const out = decodeResult(encodeResult({ a: Float64Array.from([0.1, 0.2, 1 / 3, 1e-9, 0, 0, 0, 0]) }), { arrays: "plain" }) as { a: number[] };
    expect(out.a.slice(0, 4)).toEqual([0.1, 0.2, 0.3333333, 1e-9]);
  });

  it("keeps f64 when asked", () => {
    const v = Float64Array.from([Math.PI, Math.E, 1 / 3, 2 / 3, 1, 2, 3, 4]);
    const out = decodeResult(encodeResult({ v }, { floats: "f64" })) as { v: Float64Array };
    expect(Array.from(out.v)).toEqual(Array.from(v));
  });

  it("refuses data that is not a result blob", () => {
    expect(() => decodeResult(new Uint8Array([1, 2, 3]))).toThrow(ResultFormatError);
  });
});
