"use client";
/** SWR hooks for the list and detail endpoints. */
import useSWR, { type SWRConfiguration } from "swr";
import { getJson, queryString } from "./fetch";

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

export interface ListParams {
  page?: number;
  pageSize?: number;
  sort?: string;
  order?: "asc" | "desc";
  q?: string;
  [filter: string]: string | number | boolean | undefined;
}

export function listUrl(base: string, params: ListParams): string {
  const q = queryString(params);
  return base.includes("?") && q ? `${base}&${q.slice(1)}` : base + q;
}

/** A page of a list endpoint; keeps the previous page on screen while the next one loads. */
export function useList<T>(base: string, params: ListParams, config?: SWRConfiguration<Page<T>>) {
  return useSWR<Page<T>>(listUrl(base, params), getJson, { keepPreviousData: true, ...config });
}

/** One JSON resource; pass null to wait. */
export function useResource<T>(url: string | null, config?: SWRConfiguration<T>) {
  return useSWR<T>(url, getJson, config);
}
