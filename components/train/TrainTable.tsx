"use client";
import { DataTable, type Column } from "@/components/lift/DataTable";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import type { TrainJson } from "./TrainEditor";
import { formatDate } from "@/lib/client/dates";

export function TrainTable({ units }: { units: UnitSystem }) {
  const columns: Column<TrainJson>[] = [
    { key: "name", label: "Train", sort: "name", render: (r) => r.name },
    { key: "cars", label: "Cars", sort: "cars", align: "right", render: (r) => r.cars },
    { key: "carMassEmpty", label: "Empty car", sort: "carMassEmpty", align: "right", render: (r) => formatQuantity(r.carMassEmpty, "mass", units) },
    { key: "loaded", label: "Full car", align: "right", render: (r) => formatQuantity(r.carMassLoaded, "mass", units) },
    { key: "length", label: "Car length", align: "right", render: (r) => formatQuantity(r.carLength, "length", units) },
    { key: "updatedAt", label: "Last saved", sort: "updatedAt", align: "right", render: (r) => formatDate(r.updatedAt, "day") },
  ];
  return (
    <DataTable<TrainJson>
      base="/api/trains"
      columns={columns}
      rowHref={(r) => `/trains/${r.id}`}
      defaultSort="name"
      testId="train-table"
      searchLabel="Filter trains by name"
      filters={[{ name: "archived", label: "Archived", options: [{ value: "false", label: "In use" }, { value: "true", label: "Archived" }, { value: "all", label: "All" }] }]}
      empty="No trains yet."
    />
  );
}
