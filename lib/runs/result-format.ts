/**
 * The stored result blob of a run, format `tautline-result/1`.
 *
 * The engine's result (series and frames full of numeric arrays) is split into a JSON tree, where every
 * numeric array is replaced by a reference `{ "$array": i }`, and one binary section holding the arrays'
 * values. The whole container is gzipped. Layout before gzip (all integers little-endian):
 *
 *   bytes 0–3   magic "TLR1"
 *   bytes 4–7   uint32 H, length of the header in bytes
 *   bytes 8…    header, UTF-8 JSON: { format, arrays: [{ dtype, length, offset }], value }
 *   padding to a multiple of 8, then the data section; `offset` counts from its start, each array
 *   starts on a multiple of 8 bytes. dtype is one of f32, f64, i32, u32, u8.
 *
 * Float arrays are stored as f32 by default (about 7 significant digits: plenty for plots and replay);
 * the run's summary figures are kept exactly in their own JSON column, not here.
 * It needs Node's zlib and Buffer, so it lives outside `sim/`.
 */
import { gunzipSync, gzipSync } from "node:zlib";

export const RESULT_FORMAT = "tautline-result/1";
const MAGIC = "TLR1";

export type Dtype = "f32" | "f64" | "i32" | "u32" | "u8";
type NumericArray = Float32Array | Float64Array | Int32Array | Uint32Array | Uint8Array;

interface ArrayEntry {
  dtype: Dtype;
  length: number;
  offset: number;
}

interface Header {
  format: typeof RESULT_FORMAT;
  arrays: ArrayEntry[];
  value: unknown;
}

export interface EncodeOptions {
  /** Store float arrays as f32 (default) or keep f64. */
  floats?: "f32" | "f64";
  /** Plain number arrays at least this long go to the binary section (default 8). */
  minArrayLength?: number;
}

const BYTES: Record<Dtype, number> = { f32: 4, f64: 8, i32: 4, u32: 4, u8: 1 };

function dtypeOf(a: ArrayBufferView, floats: "f32" | "f64"): Dtype | null {
  if (a instanceof Float64Array || a instanceof Float32Array) return floats;
  if (a instanceof Int32Array || a instanceof Int16Array || a instanceof Int8Array) return "i32";
  if (a instanceof Uint32Array || a instanceof Uint16Array) return "u32";
  if (a instanceof Uint8Array || a instanceof Uint8ClampedArray) return "u8";
  return null;
}

function isNumberArray(v: unknown[], min: number): v is number[] {
  if (v.length < min) return false;
  for (const x of v) if (typeof x !== "number" || !Number.isFinite(x)) return false;
  return true;
}

const align8 = (n: number) => (n + 7) & ~7;

/** Packs a result tree into the gzipped binary container described above. */
export function encodeResult(value: unknown, options: EncodeOptions = {}): Uint8Array {
  const floats = options.floats ?? "f32";
  const minLen = options.minArrayLength ?? 8;
  const arrays: ArrayEntry[] = [];
  const chunks: { offset: number; bytes: Uint8Array }[] = [];
  let dataLength = 0;

  const pushArray = (dtype: Dtype, source: ArrayLike<number>): { $array: number } => {
    const Ctor = { f32: Float32Array, f64: Float64Array, i32: Int32Array, u32: Uint32Array, u8: Uint8Array }[dtype];
    const typed = Ctor.from(source as ArrayLike<number>);
    const offset = align8(dataLength);
    const bytes = new Uint8Array(typed.buffer, typed.byteOffset, typed.byteLength);
    chunks.push({ offset, bytes });
    dataLength = offset + bytes.byteLength;
    arrays.push({ dtype, length: typed.length, offset });
    return { $array: arrays.length - 1 };
  };

  const walk = (v: unknown): unknown => {
    if (ArrayBuffer.isView(v) && !(v instanceof DataView)) {
      const dtype = dtypeOf(v, floats);
      if (!dtype) throw new Error("encodeResult: unsupported typed array (BigInt arrays are not stored)");
      return pushArray(dtype, v as unknown as ArrayLike<number>);
    }
    if (Array.isArray(v)) {
      if (isNumberArray(v, minLen)) return pushArray(v.every(Number.isInteger) ? "f64" : floats, v);
      return v.map(walk);
    }
    if (v && typeof v === "object") {
      const out: Record<string, unknown> = {};
      for (const [k, x] of Object.entries(v)) if (x !== undefined && typeof x !== "function") out[k] = walk(x);
      return out;
    }
    if (typeof v === "number" && !Number.isFinite(v)) return null;
    return v;
  };

  const tree = walk(value);
  const header: Header = { format: RESULT_FORMAT, arrays, value: tree };
  const headerBytes = new TextEncoder().encode(JSON.stringify(header));
  const dataStart = align8(8 + headerBytes.byteLength);
  const out = new Uint8Array(dataStart + dataLength);
  out.set(new TextEncoder().encode(MAGIC), 0);
  new DataView(out.buffer).setUint32(4, headerBytes.byteLength, true);
  out.set(headerBytes, 8);
  for (const c of chunks) out.set(c.bytes, dataStart + c.offset);
  const gz = gzipSync(out, { level: 6 });
  return new Uint8Array(gz.buffer, gz.byteOffset, gz.byteLength);
}

export interface DecodeOptions {
  /** "typed" (default) gives typed arrays; "plain" gives number arrays, ready for JSON. */
  arrays?: "typed" | "plain";
  /** With "plain": round f32 values to this many significant digits (default 7) so JSON stays short. */
  significantDigits?: number;
}

export class ResultFormatError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "ResultFormatError";
  }
}

/** The unzipped container: its tree (with `{ $array: i }` references) and each array as a typed array. */
export interface ResultContainer {
  value: unknown;
  dtype(i: number): Dtype;
  array(i: number): NumericArray;
}

/** Reads an unzipped container (checks the magic, the format and every array's bounds as it is read). */
export function openContainer(raw: Buffer): ResultContainer {
  if (raw.byteLength < 8 || raw.toString("latin1", 0, 4) !== MAGIC) {
    throw new ResultFormatError(`The stored result does not start with ${MAGIC}.`);
  }
  const headerLength = raw.readUInt32LE(4);
  const header = JSON.parse(raw.toString("utf8", 8, 8 + headerLength)) as Header;
  if (header.format !== RESULT_FORMAT) throw new ResultFormatError(`Unknown result format ${String(header.format)}.`);
  const dataStart = align8(8 + headerLength);
  const entry = (i: number) => {
    const e = header.arrays[i];
    if (!e) throw new ResultFormatError(`Array reference ${i} is missing.`);
    return e;
  };
  return {
    value: header.value,
    dtype: (i) => entry(i).dtype,
    array: (i) => {
      const e = entry(i);
      const start = dataStart + e.offset;
      const byteLength = e.length * BYTES[e.dtype];
      if (start + byteLength > raw.byteLength) throw new ResultFormatError("The stored result is truncated.");
      // Copy into a fresh, aligned buffer: the gunzipped Buffer may sit at any offset of a shared pool.
      const copy = new Uint8Array(byteLength);
      copy.set(raw.subarray(start, start + byteLength));
      const typed = { f32: Float32Array, f64: Float64Array, i32: Int32Array, u32: Uint32Array, u8: Uint8Array }[e.dtype];
      return new typed(copy.buffer) as NumericArray;
    },
  };
}

/** An array reference of the container's tree, or null. */
export function arrayRef(v: unknown): number | null {
  if (!v || typeof v !== "object" || Array.isArray(v)) return null;
  const o = v as Record<string, unknown>;
  return typeof o.$array === "number" && Object.keys(o).length === 1 ? o.$array : null;
}

/** A stored f32 value as JSON shows it: rounded to `digits` significant digits (the f32 noise dropped). */
export function roundF32(x: number, digits = 7): number {
  return Number(x.toPrecision(digits));
}

export function gunzipResult(blob: Uint8Array): Buffer {
  try {
    return gunzipSync(blob);
  } catch {
    throw new ResultFormatError("The stored result is not gzip data.");
  }
}

/** Unpacks a blob made by encodeResult. */
export function decodeResult(blob: Uint8Array, options: DecodeOptions = {}): unknown {
  const c = openContainer(gunzipResult(blob));
  const plain = options.arrays === "plain";
  const digits = options.significantDigits ?? 7;

  const materialise = (i: number): unknown => {
    const arr = c.array(i);
    if (!plain) return arr;
    const list = Array.from(arr);
    return c.dtype(i) === "f32" ? list.map((x) => roundF32(x, digits)) : list;
  };

  const walk = (v: unknown): unknown => {
    if (Array.isArray(v)) return v.map(walk);
    if (v && typeof v === "object") {
      const ref = arrayRef(v);
      if (ref !== null) return materialise(ref);
      const out: Record<string, unknown> = {};
      for (const [k, x] of Object.entries(v)) out[k] = walk(x);
      return out;
    }
    return v;
  };
  return walk(c.value);
}
