"use client";
/** The audit trail: who changed what and when, filtered by lift, person and dates, each change as a field-by-field diff. */
import { useState } from "react";
import type { AuditView } from "@/lib/audit/list";
import { Badge } from "@/components/ui/Badge";
import { Button } from "@/components/ui/Button";
import { Card } from "@/components/ui/Card";
import { countText, FilterBar, FilterInput, FilterSelect } from "@/components/ui/FilterBar";
import { ApiError } from "@/lib/client/fetch";
import type { Jsonify } from "@/lib/client/jsonify";
import { useList } from "@/lib/client/hooks";

type AuditJson = Jsonify<AuditView>;

const ENTITY_WORDS: Record<string, string> = { lift: "Lift", scenario: "Scenario", run: "Run", report: "Report", train: "Train", chain_spec: "Chain", comment: "Comment" };
const ACTION_TONE = { create: "pass", import: "pass", update: "lamp", archive: "caution", delete: "fail" } as const;

function show(v: unknown): string {
  if (v === null || v === undefined) return "—";
  if (typeof v === "string") return v;
  const s = JSON.stringify(v);
  return s.length > 160 ? `${s.slice(0, 157)}…` : s;
}

function Changes({ e }: { e: AuditJson }) {
  if (e.changes.length) {
    return (
      <table className="w-full text-[12px]" data-testid="audit-diff">
        <tbody>
          {e.changes.map((c) => (
            <tr key={c.path} className="align-top">
              <td className="pr-2 font-mono text-steel-600">{c.path}</td>
              <td className="pr-2 text-fail line-through decoration-fail/40">{show(c.before)}</td>
              <td className="text-pass">{show(c.after)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    );
  }
  if (e.action === "delete") return <span className="text-[12px] text-steel-500">Removed: {show(e.before)}</span>;
  if (e.action === "create" || e.action === "import") return <span className="text-[12px] text-steel-500">Created: {show(e.after)}</span>;
  return <span className="text-[12px] text-steel-500">No field changed.</span>;
}

export function AuditTrail({ users, lifts }: { users: { id: number; name: string }[]; lifts: { id: number; name: string }[] }) {
  const [liftId, setLiftId] = useState("");
  const [userId, setUserId] = useState("");
  const [from, setFrom] = useState("");
  const [to, setTo] = useState("");
  const [page, setPage] = useState(1);
  const list = useList<AuditJson>("/api/audit", {
    liftId: liftId || undefined,
    userId: userId || undefined,
    // Whole days in UTC, as the table shows them.
    from: from ? `${from}T00:00:00.000Z` : undefined,
    to: to ? `${to}T23:59:59.999Z` : undefined,
    page,
    pageSize: 50,
  });
  const items = list.data?.items ?? [];
  const pages = list.data ? Math.max(1, Math.ceil(list.data.total / list.data.pageSize)) : 1;
  const reset = (fn: (v: string) => void) => (v: string) => {
    fn(v);
    setPage(1);
  };
  return (
    <Card>
      <FilterBar total={countText(list.data?.total, "entry", "entries")} totalTestId="audit-total">
        <FilterSelect label="Lift" value={liftId} onChange={reset(setLiftId)} options={[{ value: "", label: "Every lift" }, ...lifts.map((l) => ({ value: l.id, label: l.name }))]} testId="audit-lift" />
        <FilterSelect label="Person" value={userId} onChange={reset(setUserId)} options={[{ value: "", label: "Everyone" }, ...users.map((u) => ({ value: u.id, label: u.name }))]} testId="audit-user" />
        <FilterInput label="From (UTC)" type="date" value={from} onChange={reset(setFrom)} testId="audit-from" />
        <FilterInput label="To (UTC)" type="date" value={to} onChange={reset(setTo)} testId="audit-to" />
      </FilterBar>
      {list.error && <p className="px-4 py-2 text-[13px] text-fail">{list.error instanceof ApiError ? list.error.message : String(list.error)}</p>}
      <ul className="divide-y divide-steel-100" data-testid="audit-entries">
        {items.map((e) => (
          <li key={e.id} className="grid gap-2 px-4 py-2.5 text-[13px] md:grid-cols-[170px_160px_minmax(0,1fr)]" data-testid="audit-entry">
            <div className="text-steel-500">
              {new Date(e.at).toISOString().slice(0, 16).replace("T", " ")} UTC
              <div className="text-ink-800">{e.user?.name ?? "System"}</div>
            </div>
            <div>
              <Badge tone={ACTION_TONE[e.action as keyof typeof ACTION_TONE] ?? "neutral"}>{e.action}</Badge>{" "}
              <span className="font-semibold">
                {ENTITY_WORDS[e.entity] ?? e.entity} {e.entityId}
              </span>
            </div>
            <div className="min-w-0 overflow-x-auto">
              <Changes e={e} />
            </div>
          </li>
        ))}
        {list.data && !items.length && <li className="px-4 py-3 text-[13px] text-steel-500">No entry matches these filters.</li>}
      </ul>
      {pages > 1 && (
        <div className="flex items-center gap-2 border-t border-steel-100 px-4 py-2 text-[13px]">
          <Button size="sm" variant="secondary" disabled={page <= 1} onClick={() => setPage(page - 1)}>
            Newer
          </Button>
          <span>
            Page {page} of {pages}
          </span>
          <Button size="sm" variant="secondary" disabled={page >= pages} onClick={() => setPage(page + 1)}>
            Older
          </Button>
        </div>
      )}
    </Card>
  );
}
