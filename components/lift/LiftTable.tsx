"use client";
import { DataTable, type Column } from "./DataTable";
import type { LiftListItemJson } from "./types";
import { formatDate } from "@/lib/client/dates";

const columns: Column<LiftListItemJson>[] = [
  { key: "name", label: "Lift", sort: "name", render: (r) => r.name },
  { key: "site", label: "Site", sort: "site", render: (r) => r.site ?? "—" },
  { key: "revision", label: "Revision", align: "right", render: (r) => (r.currentRevisionNumber ? `r${r.currentRevisionNumber}` : "—") },
  { key: "updatedAt", label: "Last saved", sort: "updatedAt", align: "right", render: (r) => formatDate(r.updatedAt, "day") },
];

export function LiftTable() {
  return (
    <DataTable<LiftListItemJson>
      base="/api/lifts"
      columns={columns}
      rowHref={(r) => `/lifts/${r.id}`}
      defaultSort="name"
      testId="lift-table"
      searchLabel="Filter lifts by name or site"
      filters={[{ name: "archived", label: "Archived", options: [{ value: "false", label: "In use" }, { value: "true", label: "Archived" }, { value: "all", label: "All" }] }]}
      empty="No lifts yet."
    />
  );
}
