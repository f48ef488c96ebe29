"use client";
/** The lift's revisions, newest first; choosing one shows what it changed from the one before. */
import { useState } from "react";
import { Badge } from "@/components/ui/Badge";
import { Card, CardHeader } from "@/components/ui/Card";
import { cx } from "@/components/ui/cx";
import { useList, useResource } from "@/lib/client/hooks";
import { editText, unitOf, type UnitSystem } from "@/lib/client/units";
import { ALL_NUMBER_FIELDS, labelOf } from "./fields";
import type { FieldChangeJson, RevisionDetailJson, RevisionListItemJson } from "./types";
import { formatDate } from "@/lib/client/dates";

function shownValue(path: string, v: unknown, units: UnitSystem): string {
  if (v === null || v === undefined) return "—";
  const def = ALL_NUMBER_FIELDS.find((f) => f.path === path);
  if (def && typeof v === "number") {
    const u = unitOf(def.q, units).label;
    return `${editText(v, def.q, units)}${u ? ` ${u}` : ""}`;
  }
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (path === "lift.profile" && Array.isArray(v)) return `${v.length} piece${v.length === 1 ? "" : "s"}`;
  return typeof v === "object" ? JSON.stringify(v) : String(v);
}

export function ChangeList({ changes, units }: { changes: FieldChangeJson[]; units: UnitSystem }) {
  if (!changes.length) return <p className="px-4 py-3 text-[13px] text-steel-500">No field changed.</p>;
  return (
    <table className="w-full text-[12.5px] tabular-nums" data-testid="revision-diff">
      <thead className="bg-steel-100/70 text-[11px] uppercase tracking-wide text-steel-500">
        <tr>
          <th className="px-3 py-1.5 text-left font-semibold">Field</th>
          <th className="px-3 py-1.5 text-right font-semibold">Before</th>
          <th className="px-3 py-1.5 text-right font-semibold">After</th>
        </tr>
      </thead>
      <tbody>
        {changes.map((c) => (
          <tr key={c.path} className="border-b border-steel-100 last:border-0">
            <td className="px-3 py-1.5">
              <span className="font-semibold text-ink-900">{labelOf(c.path)}</span>
              <span className="ml-1.5 font-mono text-[10.5px] text-steel-500">{c.path}</span>
            </td>
            <td className="px-3 py-1.5 text-right font-mono text-steel-500 line-through decoration-steel-300">{shownValue(c.path, c.before, units)}</td>
            <td className="px-3 py-1.5 text-right font-mono font-semibold text-ink-900">{shownValue(c.path, c.after, units)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

export function RevisionHistory({ liftId, units }: { liftId: number; units: UnitSystem }) {
  const list = useList<RevisionListItemJson>(`/api/lifts/${liftId}/revisions`, { pageSize: 50 });
  const [picked, setPicked] = useState<number | null>(null);
  const newest = list.data?.items[0]?.number ?? null;
  const number = picked ?? newest;
  const detail = useResource<RevisionDetailJson>(number ? `/api/lifts/${liftId}/revisions/${number}` : null);
  return (
    <Card data-testid="revision-history">
      <CardHeader title="Revision history" description="Every save is kept. Choose one to see what it changed." />
      <ol className="max-h-72 divide-y divide-steel-100 overflow-y-auto">
        {list.data?.items.map((r) => (
          <li key={r.id}>
            <button
              type="button"
              onClick={() => setPicked(r.number)}
              className={cx("flex w-full items-start gap-3 px-4 py-2 text-left text-[13px] hover:bg-paper", r.number === number && "bg-lamp-300/15")}
              data-testid={`revision-${r.number}`}
            >
              <span className="w-9 shrink-0 font-mono font-semibold text-ink-900">r{r.number}</span>
              <span className="min-w-0 flex-1">
                <span className="block truncate text-ink-900" data-user-text>{r.changeSummary ?? "No note"}</span>
                <span className="block text-[11.5px] text-steel-500">{formatDate(r.createdAt, "dayTime")}</span>
              </span>
              {r.current && <Badge tone="pass">Current</Badge>}
            </button>
          </li>
        ))}
        {list.error && <li className="px-4 py-3 text-[13px] text-fail">{String(list.error.message)}</li>}
      </ol>
      {detail.data && (
        <div className="border-t border-steel-100">
          <p className="px-4 pb-1 pt-3 text-[12.5px] font-semibold text-ink-800" data-testid="diff-title">
            {detail.data.comparedWith ? `Revision ${detail.data.revision.number} against revision ${detail.data.comparedWith}` : `Revision ${detail.data.revision.number} (first revision)`}
          </p>
          {detail.data.comparedWith ? <ChangeList changes={detail.data.changes} units={units} /> : <p className="px-4 pb-3 text-[13px] text-steel-500">The first revision has nothing to compare with.</p>}
        </div>
      )}
    </Card>
  );
}
