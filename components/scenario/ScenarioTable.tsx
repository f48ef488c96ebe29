"use client";
import { Badge } from "@/components/ui/Badge";
import { DataTable, type Column } from "@/components/lift/DataTable";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { LOADING_LABELS, type ScenarioJson } from "./types";
import { formatDate } from "@/lib/client/dates";

export function ScenarioTable({ units, liftId }: { units: UnitSystem; liftId?: number }) {
  const columns: Column<ScenarioJson>[] = [
    { key: "name", label: "Scenario", sort: "name", render: (r) => r.name },
    {
      key: "lift",
      label: "Lift",
      render: (r) => (
        <span>
          {r.liftName ?? "—"} <span className="font-mono text-[12px] text-steel-500">r{r.liftRevisionNumber ?? "?"}</span>
          {!r.pinnedToCurrent && (
            <Badge tone="caution" className="ml-1.5">
              older revision
            </Badge>
          )}
        </span>
      ),
    },
    { key: "train", label: "Train", render: (r) => r.trainName ?? "—" },
    { key: "loading", label: "Loading", render: (r) => (r.loading === "riders" ? `${r.riderCount ?? 0} riders` : LOADING_LABELS[r.loading]) },
    { key: "entrySpeed", label: "Entry speed", sort: "entrySpeed", align: "right", render: (r) => formatQuantity(r.entrySpeed, "speed", units) },
    { key: "updatedAt", label: "Last saved", sort: "updatedAt", align: "right", render: (r) => formatDate(r.updatedAt, "day") },
  ];
  return (
    <DataTable<ScenarioJson>
      base={liftId ? `/api/scenarios?liftId=${liftId}` : "/api/scenarios"}
      columns={columns}
      rowHref={(r) => `/scenarios/${r.id}`}
      defaultSort="name"
      testId="scenario-table"
      searchLabel="Filter scenarios by name or notes"
      filters={[
        { name: "loading", label: "Loading", options: [{ value: "", label: "Any loading" }, { value: "empty", label: "Empty" }, { value: "full", label: "Full" }, { value: "riders", label: "Some riders" }] },
        { name: "archived", label: "Archived", options: [{ value: "false", label: "In use" }, { value: "true", label: "Archived" }, { value: "all", label: "All" }] },
      ]}
      empty="No scenarios yet."
    />
  );
}
