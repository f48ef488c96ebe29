"use client";
/**
 * A server-sorted, server-filtered list table over one of our list endpoints
 * (`?page&pageSize&sort&order&q&…filters`): click a column heading to sort, type to filter.
 */
import Link from "next/link";
import { useEffect, useState, type ReactNode } from "react";
import { Input, Select } from "@/components/ui/Field";
import { Table, THead, Th, Td, Tr } from "@/components/ui/Table";
import { cx } from "@/components/ui/cx";
import { useList, type ListParams } from "@/lib/client/hooks";

export interface Column<T> {
  key: string;
  label: string;
  /** API sort field; absent = not sortable. */
  sort?: string;
  align?: "left" | "right";
  render: (row: T) => ReactNode;
}

export interface FilterDef {
  name: string;
  label: string;
  options: { value: string; label: string }[];
}

export function DataTable<T extends { id: number }>({
  base,
  columns,
  rowHref,
  defaultSort,
  filters = [],
  searchLabel = "Filter by name",
  testId,
  empty,
}: {
  base: string;
  columns: Column<T>[];
  rowHref: (row: T) => string;
  defaultSort: string;
  filters?: FilterDef[];
  searchLabel?: string;
  testId: string;
  empty?: ReactNode;
}) {
  const [sort, setSort] = useState(defaultSort);
  const [order, setOrder] = useState<"asc" | "desc">("asc");
  const [text, setText] = useState("");
  const [q, setQ] = useState("");
  const [page, setPage] = useState(1);
  const [extra, setExtra] = useState<Record<string, string>>({});
  useEffect(() => {
    const t = setTimeout(() => {
      setQ(text.trim());
      setPage(1);
    }, 250);
    return () => clearTimeout(t);
  }, [text]);
  const pageSize = 25;
  const params: ListParams = { sort, order, q: q || undefined, page, pageSize, ...extra };
  const { data, error, isLoading } = useList<T>(base, params);
  const pages = data ? Math.max(1, Math.ceil(data.total / pageSize)) : 1;

  const toggle = (field: string) => {
    if (sort === field) setOrder((o) => (o === "asc" ? "desc" : "asc"));
    else {
      setSort(field);
      setOrder("asc");
    }
    setPage(1);
  };

  return (
    <div className="rounded-lg border border-steel-300/70 bg-white" data-testid={testId}>
      <div className="flex flex-wrap items-center gap-3 border-b border-steel-100 px-4 py-2.5">
        <Input aria-label={searchLabel} placeholder={searchLabel} className="h-8 max-w-xs text-[13px]" value={text} onChange={(e) => setText(e.target.value)} data-testid={`${testId}-search`} />
        {filters.map((f) => (
          <Select
            key={f.name}
            aria-label={f.label}
            className="h-8 w-auto text-[13px]"
            value={extra[f.name] ?? ""}
            onChange={(e) => {
              setExtra((x) => ({ ...x, [f.name]: e.target.value }));
              setPage(1);
            }}
          >
            {f.options.map((o) => (
              <option key={o.value} value={o.value}>
                {o.label}
              </option>
            ))}
          </Select>
        ))}
        <span className="ml-auto text-[12.5px] text-steel-500" data-testid={`${testId}-count`}>
          {data ? `${data.total} ${data.total === 1 ? "row" : "rows"}` : isLoading ? "Loading…" : ""}
        </span>
      </div>
      <Table>
        <THead>
          <tr>
            {columns.map((c) => (
              <Th key={c.key} className={c.align === "right" ? "text-right" : undefined} aria-sort={c.sort && sort === c.sort ? (order === "asc" ? "ascending" : "descending") : undefined}>
                {c.sort ? (
                  <button type="button" onClick={() => toggle(c.sort!)} className="inline-flex items-center gap-1 uppercase tracking-wide hover:text-ink-900" data-testid={`sort-${c.key}`}>
                    {c.label}
                    <span aria-hidden className={cx("font-mono text-[10px]", sort === c.sort ? "text-lamp-600" : "text-steel-300")}>
                      {sort === c.sort ? (order === "asc" ? "▲" : "▼") : "↕"}
                    </span>
                  </button>
                ) : (
                  c.label
                )}
              </Th>
            ))}
          </tr>
        </THead>
        <tbody>
          {data?.items.map((row) => (
            <Tr key={row.id} data-testid={`${testId}-row`}>
              {columns.map((c, i) => (
                <Td key={c.key} className={c.align === "right" ? "text-right font-mono text-[13px]" : undefined}>
                  {i === 0 ? (
                    <Link href={rowHref(row)} className="font-semibold text-ink-900 hover:text-lamp-600 hover:underline">
                      {c.render(row)}
                    </Link>
                  ) : (
                    c.render(row)
                  )}
                </Td>
              ))}
            </Tr>
          ))}
          {data && data.items.length === 0 && (
            <tr>
              <td colSpan={columns.length} className="px-4 py-8 text-center text-[13px] text-steel-500">
                {empty ?? "Nothing matches."}
              </td>
            </tr>
          )}
          {error && (
            <tr>
              <td colSpan={columns.length} className="px-4 py-6 text-center text-[13px] text-fail">
                {error.message}
              </td>
            </tr>
          )}
        </tbody>
      </Table>
      {pages > 1 && (
        <div className="flex items-center justify-end gap-2 border-t border-steel-100 px-4 py-2 text-[12.5px]">
          <button type="button" className="rounded px-2 py-1 hover:bg-steel-100 disabled:opacity-40" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
            Previous
          </button>
          <span className="text-steel-500">
            Page {page} of {pages}
          </span>
          <button type="button" className="rounded px-2 py-1 hover:bg-steel-100 disabled:opacity-40" disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>
            Next
          </button>
        </div>
      )}
    </div>
  );
}
