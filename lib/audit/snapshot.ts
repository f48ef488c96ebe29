/**
 * A JSON-safe copy of a row or view for the audit trail: dates become ISO strings, undefined is dropped,
 * Buffers (result blobs) are replaced by their size so an audit entry never carries binary data.
 */
export function snapshot(value: unknown): unknown {
  if (value === null || value === undefined) return null;
  if (value instanceof Date) return value.toISOString();
  if (typeof value === "object" && value !== null && "byteLength" in value && ArrayBuffer.isView(value)) {
    return { bytes: (value as ArrayBufferView).byteLength };
  }
  if (Array.isArray(value)) return value.map(snapshot);
  if (typeof value === "object") {
    const source =
      typeof (value as { get?: unknown }).get === "function" && "dataValues" in (value as object)
        ? (value as { get: (o: { plain: true }) => Record<string, unknown> }).get({ plain: true })
        : (value as Record<string, unknown>);
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(source)) {
      if (v !== undefined) out[k] = snapshot(v);
    }
    return out;
  }
  if (typeof value === "number" && !Number.isFinite(value)) return null;
  return value;
}
