"use client";
/** Reports of the organisation, filterable: by default the queue of reports awaiting review. */
import Link from "next/link";
import { useState } from "react";
import type { ReportView } from "@/lib/reports/service";
import { Badge } from "@/components/ui/Badge";
import { Card } from "@/components/ui/Card";
import { countText, FilterBar, FilterInput, FilterSelect } from "@/components/ui/FilterBar";
import { Table, Td, Th, THead, Tr } from "@/components/ui/Table";
import { useList, useResource } from "@/lib/client/hooks";

export const STATUS_TONE = { draft: "neutral", submitted: "lamp", returned: "caution", approved: "pass" } as const;
const STATUS_WORDS: Record<string, string> = { submitted: "Awaiting review", returned: "Returned", approved: "Approved", draft: "Drafts", "": "Every status" };

export function ReportQueue({ initialStatus }: { initialStatus: string }) {
  const [status, setStatus] = useState(initialStatus);
  const [liftId, setLiftId] = useState("");
  const [q, setQ] = useState("");
  const lifts = useResource<{ items: { id: number; name: string }[] }>("/api/lifts?pageSize=100&sort=name");
  const list = useList<ReportView>("/api/reports", { status: status || undefined, liftId: liftId || undefined, q: q || undefined, sort: "submittedAt", order: "desc", pageSize: 50 });
  const items = list.data?.items ?? [];
  return (
    <Card>
      <FilterBar total={countText(list.data?.total, "report", "reports")}>
        <FilterSelect label="Status" value={status} onChange={setStatus} options={Object.entries(STATUS_WORDS).map(([value, label]) => ({ value, label }))} testId="queue-status" />
        <FilterSelect label="Lift" value={liftId} onChange={setLiftId} options={[{ value: "", label: "Every lift" }, ...(lifts.data?.items ?? []).map((l) => ({ value: l.id, label: l.name }))]} testId="queue-lift" />
        <FilterInput label="Title contains" value={q} onChange={setQ} testId="queue-search" />
      </FilterBar>
      <Table>
        <THead>
          <tr>
            <Th>Report</Th>
            <Th>Scenario</Th>
            <Th>Author</Th>
            <Th>Status</Th>
            <Th>Submitted</Th>
          </tr>
        </THead>
        <tbody data-testid="report-queue">
          {items.map((r) => (
            <Tr key={r.id} data-testid="queue-row">
              <Td>
                <Link className="font-semibold text-ink-900 hover:text-lamp-600 hover:underline" href={`/reports/${r.id}`}>
                  {r.title}
                </Link>
              </Td>
              <Td>{r.scenarioName ?? `Scenario ${r.scenarioId}`}</Td>
              <Td>{r.authorName ?? "—"}</Td>
              <Td>
                <Badge tone={STATUS_TONE[r.status as keyof typeof STATUS_TONE] ?? "neutral"}>{r.status}</Badge>
              </Td>
              <Td>{r.submittedAt ? new Date(r.submittedAt).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" }) : "—"}</Td>
            </Tr>
          ))}
          {list.data && !items.length && (
            <tr>
              <Td colSpan={5} className="text-steel-500">
                No report matches these filters.
              </Td>
            </tr>
          )}
        </tbody>
      </Table>
    </Card>
  );
}
