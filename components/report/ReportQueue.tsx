"use client";
/** Reports of the organisation, filterable: by default the queue of reports awaiting review. */
import Link from "next/link";
import { useState } from "react";
import type { ReportView } from "@/lib/reports/service";
import { Badge } from "@/components/ui/Badge";
import { Card } from "@/components/ui/Card";
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
      <div className="flex flex-wrap items-end gap-3 border-b border-steel-100 px-4 py-3 text-[13px]">
        <label className="flex flex-col gap-1">
          <span className="font-semibold text-steel-600">Status</span>
          <select className="h-8 rounded border border-steel-300 px-2" value={status} onChange={(e) => setStatus(e.target.value)} data-testid="queue-status">
            {Object.entries(STATUS_WORDS).map(([v, w]) => (
              <option key={v} value={v}>
                {w}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-semibold text-steel-600">Lift</span>
          <select className="h-8 rounded border border-steel-300 px-2" value={liftId} onChange={(e) => setLiftId(e.target.value)} data-testid="queue-lift">
            <option value="">Every lift</option>
            {(lifts.data?.items ?? []).map((l) => (
              <option key={l.id} value={l.id}>
                {l.name}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-semibold text-steel-600">Title contains</span>
          <input className="h-8 rounded border border-steel-300 px-2" value={q} onChange={(e) => setQ(e.target.value)} data-testid="queue-search" />
        </label>
        <span className="ml-auto text-steel-500">{list.data ? `${list.data.total} report${list.data.total === 1 ? "" : "s"}` : "Loading…"}</span>
      </div>
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
