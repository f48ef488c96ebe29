// Query-string rules shared by list routes: paging, sorting, filters, archived rows (400 naming the parameter).
import { z } from "zod";
import type { Order } from "sequelize";
import { toId } from "./ids";

export const MAX_PAGE_SIZE = 100;
export const DEFAULT_PAGE_SIZE = 20;

/** `true`/`false`/`1`/`0` from a query string. */
export const queryBoolean = (name: string) =>
  z.enum(["true", "false", "1", "0"], { error: `${name} must be true or false` }).transform((v) => v === "true" || v === "1");

/** A positive whole-number id from a query string (the same rule as path ids, lib/http/ids.ts). */
export const queryId = (name: string) =>
  z.preprocess(
    (v) => (typeof v === "number" ? String(v) : v),
    z.string({ error: `${name} must be a whole number` }).transform((v, ctx) => {
      const id = toId(v);
      if (id === null) ctx.addIssue({ code: "custom", message: `${name} must be a positive whole-number id in plain digits (like 12)` });
      return id ?? 0;
    }),
  );

/** A whole number from a query string within [min, max], `fallback` when absent (400 naming the parameter). */
export const queryWholeNumber = (name: string, min: number, max: number, fallback: number) =>
  z.coerce
    .number({ error: `${name} must be a whole number` })
    .int({ error: `${name} must be a whole number` })
    .min(min, { error: `${name} must be at least ${min}` })
    .max(max, { error: `${name} must be at most ${max}` })
    .default(fallback);

/** `page` (from 1) and `pageSize` (up to 100) of a list's query string. */
export const pagingFields = {
  page: queryWholeNumber("page", 1, 100_000, 1),
  pageSize: queryWholeNumber("pageSize", 1, MAX_PAGE_SIZE, DEFAULT_PAGE_SIZE),
};

/** Archived rows are hidden by default; `archived=true` shows only archived rows, `archived=all` both. */
export const archivedFilter = z
  .enum(["false", "true", "all"], { error: "archived must be false, true or all" })
  .default("false");

/**
 * The query string of every list endpoint:
 * `?page=&pageSize=(≤100)&sort=field&order=asc|desc&q=text&…filters`.
 * Unknown sort fields answer 400 naming `sort`. Unknown parameters are ignored.
 */
export function listQuerySchema<const S extends readonly [string, ...string[]], F extends z.ZodRawShape>(opts: {
  sortFields: S;
  defaultSort: S[number];
  defaultOrder?: "asc" | "desc";
  filters: F;
}) {
  return z.object({
    ...pagingFields,
    sort: z
      .enum(opts.sortFields, { error: `sort must be one of ${opts.sortFields.join(", ")}` })
      .default(opts.defaultSort as never),
    order: z.enum(["asc", "desc"], { error: "order must be asc or desc" }).default(opts.defaultOrder ?? "asc"),
    q: z.string().trim().max(200, { error: "q must be at most 200 characters" }).optional(),
    ...opts.filters,
  });
}

export interface PageRequest {
  page: number;
  pageSize: number;
  sort: string;
  order: "asc" | "desc";
}

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

/** limit/offset/order for Sequelize; ties broken by id so pages never overlap. */
export function pageOptions(q: PageRequest): { limit: number; offset: number; order: Order } {
  const dir = q.order === "desc" ? "DESC" : "ASC";
  const order: Order = q.sort === "id" ? [["id", dir]] : [[q.sort, dir], ["id", dir]];
  return { limit: q.pageSize, offset: (q.page - 1) * q.pageSize, order };
}

export function toPage<T>(items: T[], total: number, q: PageRequest): Page<T> {
  return { items, total, page: q.page, pageSize: q.pageSize };
}

/** `%text%` for a LIKE search, with the LIKE wildcards in the user's text escaped. */
export function likePattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}
