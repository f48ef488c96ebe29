/**
 * The client's view of a `lib/` view type after it crossed JSON: dates become ISO strings, undefined
 * members and functions are dropped. Client types derive from view types with this; none is copied.
 */
export type Jsonify<T> = T extends Date
  ? string
  : T extends string | number | boolean | null
    ? T
    : T extends (...args: never[]) => unknown
      ? never
      : T extends ReadonlyArray<infer U>
        ? Jsonify<U>[]
        : T extends object
          ? { [K in keyof T as T[K] extends (...args: never[]) => unknown ? never : K]: Jsonify<T[K]> }
          : T;

/** A server value as the browser will receive it (the one place a page turns a view into JSON). */
export function toJson<T>(value: T): Jsonify<T> {
  return JSON.parse(JSON.stringify(value)) as Jsonify<T>;
}
