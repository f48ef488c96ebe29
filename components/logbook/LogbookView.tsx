"use client";
/**
 * The logbook of one lift: trend cards (TrendCards), the entry form (EntryForm), the filterable table,
 * the lift's recordings and levels (SettingsForm). Lengths in mm (SI) or inches (US customary) at the edge; SI to the API.
 */
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useCallback, useEffect, useState } from "react";
import { Alert } from "@/components/ui/Alert";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { Field, Input, Options, Select } from "@/components/ui/Field";
import { SafetyNote } from "@/components/ui/SafetyNote";
import { Table, THead, Td, Th, Tr } from "@/components/ui/Table";
import { getJson, queryString } from "@/lib/client/fetch";
import type { Jsonify } from "@/lib/client/jsonify";
import type { RecordingView } from "@/lib/recordings/service";
import type { UnitSystem } from "@/lib/client/units";
import { EntryForm } from "./EntryForm";
import { Reading } from "./Reading";
import { SettingsForm } from "./SettingsForm";
import { TrendCards } from "./TrendCards";
import { ChainRunPanel } from "./ChainRunPanel";
import { KIND_LABELS, type AlertJson, type EntryJson, type TrendJson } from "./types";
import { alertMessageIn } from "@/lib/alerts/words";

const INCH = 0.0254;

type RecordingJson = Jsonify<RecordingView>;

export function LogbookView({
  lifts,
  liftId,
  units,
  canWrite,
  canSettings,
  canUpload,
  canRun = false,
}: {
  lifts: { id: number; name: string }[];
  liftId: number;
  units: UnitSystem;
  canWrite: boolean;
  canSettings: boolean;
  canUpload: boolean;
  /** May start runs: with canWrite, the "Run with today's chain" panel. */
  canRun?: boolean;
}) {
  const router = useRouter();
  const len = units === "us" ? { unit: "in", scale: 1 / INCH, digits: 2 } : { unit: "mm", scale: 1000, digits: 0 };
  const [trend, setTrend] = useState<TrendJson | null>(null);
  const [entries, setEntries] = useState<EntryJson[]>([]);
  const [filter, setFilter] = useState<{ kind: string; from: string; to: string }>({ kind: "", from: "", to: "" });
  const [error, setError] = useState<string | null>(null);
  const [raised, setRaised] = useState<AlertJson[]>([]);
  const [recordings, setRecordings] = useState<RecordingJson[]>([]);

  const [reload, setReload] = useState(0);
  const load = useCallback(() => setReload((n) => n + 1), []);
  useEffect(() => {
    const q = queryString({ liftId, kind: filter.kind || undefined, from: filter.from || undefined, to: filter.to ? `${filter.to}T23:59:59` : undefined, pageSize: 200 });
    Promise.all([getJson<TrendJson>(`/api/logbook/lifts/${liftId}`), getJson<{ items: EntryJson[] }>(`/api/logbook/entries${q}`), getJson<{ recordings: RecordingJson[] }>(`/api/recordings?liftId=${liftId}`)])
      .then(([t, e, r]) => {
        setTrend(t);
        setEntries(e.items);
        setRecordings(r.recordings);
      })
      .catch((err) => setError(err instanceof Error ? err.message : String(err)));
  }, [liftId, filter, reload]);

  return (
    <div className="space-y-5" data-testid="logbook">
      <div className="flex flex-wrap items-end gap-3">
        <Field label="Lift" name="lift" className="w-72">
          <Select id="lift" value={liftId} onChange={(e) => router.push(`/logbook?lift=${e.target.value}`)}>
            <Options items={lifts} label={(l) => l.name} />
          </Select>
        </Field>
        {canUpload && (
          <Link className="text-[13.5px] font-semibold text-lamp-600 hover:underline" href={`/logbook/upload?lift=${liftId}`}>
            Upload a logger recording
          </Link>
        )}
      </div>
      {error && <Alert tone="error">{error}</Alert>}
      {raised.length > 0 && (
        <Alert tone="caution" title="This entry raised alerts" testId="raised-alerts">
          <ul>
            {raised.map((a) => (
              <li key={a.id}>{alertMessageIn(a.message, units)} {a.recipients.length ? `E-mailed to ${a.recipients.join(", ")}.` : ""}</li>
            ))}
          </ul>
        </Alert>
      )}
      {trend && <TrendCards trend={trend} len={len} />}
      {canWrite && canRun && trend && <ChainRunPanel liftId={liftId} latest={trend.elongation.latest} />}
      {canWrite && trend && (
        <EntryForm
          liftId={liftId}
          trend={trend}
          len={len}
          onSaved={(alerts) => {
            setRaised(alerts);
            load();
          }}
        />
      )}
      <Card>
        <CardHeader title="Entries" description="Newest first. Filter by type and date." />
        <CardBody className="space-y-3">
          <div className="flex flex-wrap items-end gap-3">
            <Field label="Type" name="filter-kind" className="w-56">
              <Select id="filter-kind" value={filter.kind} onChange={(e) => setFilter({ ...filter, kind: e.target.value })}>
                <option value="">All types</option>
                {Object.entries(KIND_LABELS).map(([k, v]) => (
                  <option key={k} value={k}>
                    {v}
                  </option>
                ))}
              </Select>
            </Field>
            <Field label="From" name="filter-from" className="w-44">
              <Input id="filter-from" type="date" value={filter.from} onChange={(e) => setFilter({ ...filter, from: e.target.value })} />
            </Field>
            <Field label="To" name="filter-to" className="w-44">
              <Input id="filter-to" type="date" value={filter.to} onChange={(e) => setFilter({ ...filter, to: e.target.value })} />
            </Field>
          </div>
          <Table>
            <THead>
              <Tr>
                <Th>Date</Th>
                <Th>Type</Th>
                <Th>Reading</Th>
                <Th>By</Th>
                <Th>Notes</Th>
              </Tr>
            </THead>
            <tbody data-testid="entries">
              {entries.map((e) => (
                <Tr key={e.id}>
                  <Td>{new Date(e.measuredAt).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" })}</Td>
                  <Td>{KIND_LABELS[e.kind]}</Td>
                  <Td>
                    <Reading e={e} len={len} />
                  </Td>
                  <Td>{e.userName ?? "—"}</Td>
                  <Td className="max-w-xs">{e.notes}</Td>
                </Tr>
              ))}
            </tbody>
          </Table>
          {entries.length === 0 && <p className="text-[13px] text-steel-500">No entries match.</p>}
        </CardBody>
      </Card>
      <Card>
        <CardHeader title="Logger recordings" description="Dispatches recorded on this lift: overlay on a run, calibrate the chain." />
        <CardBody>
          {recordings.length === 0 ? (
            <p className="text-[13px] text-steel-500">None yet.</p>
          ) : (
            <ul className="space-y-1.5 text-[13.5px]" data-testid="recordings">
              {recordings.map((r) => (
                <li key={r.id}>
                  <Link className="font-semibold text-ink-900 hover:underline" href={`/logbook/recordings/${r.id}`}>
                    {r.name}
                  </Link>{" "}
                  <span className="text-steel-500">
                    {r.sampleCount} samples, {r.duration.toFixed(1)} s, {new Date(r.createdAt).toLocaleDateString("en-GB", { dateStyle: "medium" })}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </CardBody>
      </Card>
      {canSettings && trend && <SettingsForm liftId={liftId} trend={trend} onSaved={load} />}
      <SafetyNote />
    </div>
  );
}
