"use client";
/**
 * The logbook of one lift: trend charts with forecasts, the entry form, the filterable table, the lift's
 * levels and its open alerts. Lengths in mm (SI) or inches (US customary) at the edge; SI to the API.
 */
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useCallback, useEffect, useState } from "react";
import { Alert } from "@/components/ui/Alert";
import { Badge } from "@/components/ui/Badge";
import { Button } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { Field, Input, Select } from "@/components/ui/Field";
import { SafetyNote } from "@/components/ui/SafetyNote";
import { Table, THead, Td, Th, Tr } from "@/components/ui/Table";
import { ApiError, getJson, issueMap, queryString, sendJson } from "@/lib/client/fetch";
import type { UnitSystem } from "@/lib/client/units";
import { TrendChart } from "./TrendChart";
import { MIN_FORECAST_READINGS } from "@/lib/logbook/forecast";
import { KIND_LABELS, type AlertJson, type EntryJson, type ForecastJson, type TrendJson } from "./types";

const INCH = 0.0254;

interface RecordingJson {
  id: number;
  name: string;
  sampleCount: number;
  duration: number;
  createdAt: string;
}
const day = (iso: string | null) => (iso ? new Date(iso).toLocaleDateString("en-GB", { dateStyle: "medium" }) : "—");

export function LogbookView({
  lifts,
  liftId,
  units,
  canWrite,
  canSettings,
  canUpload,
}: {
  lifts: { id: number; name: string }[];
  liftId: number;
  units: UnitSystem;
  canWrite: boolean;
  canSettings: boolean;
  canUpload: boolean;
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
            {lifts.map((l) => (
              <option key={l.id} value={l.id}>
                {l.name}
              </option>
            ))}
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
              <li key={a.id}>{a.message} {a.recipients.length ? `E-mailed to ${a.recipients.join(", ")}.` : ""}</li>
            ))}
          </ul>
        </Alert>
      )}
      {trend && <TrendCards trend={trend} len={len} />}
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

type Len = { unit: string; scale: number; digits: number };

function Reading({ e, len }: { e: EntryJson; len: Len }) {
  const d = e.data as Record<string, number | string | null | number[]>;
  if (e.kind === "elongation") return <span>{e.elongationPercent!.toFixed(2)} % over {String(d.pitches)} pitches</span>;
  if (e.kind === "take-up") return <span>{(e.takeUpPosition! * len.scale).toFixed(len.digits)} {len.unit} below the top stop</span>;
  if (e.kind === "links-removed")
    return (
      <span>
        {String(d.links)} links: take-up rises {((d.rise as number) * len.scale).toFixed(len.digits)} {len.unit}
        {d.expectedPosition !== null ? `, expected at ${((d.expectedPosition as number) * len.scale).toFixed(len.digits)} ${len.unit}` : ""}
      </span>
    );
  if (e.kind === "lubrication") return <span>{(d.lubricant as string) ?? "—"}</span>;
  return (
    <span>
      {String(d.findings)}
      {e.photos.map((p) => (
        <a key={p.id} href={p.url} target="_blank" rel="noreferrer" className="ml-2 underline">
          photo
        </a>
      ))}
    </span>
  );
}

/** Why a trend has no date, in words (the minimum of readings and its reason are the forecast's own). */
function noForecastWords(f: ForecastJson | null, readings: number): string {
  const min = f?.minimumReadings ?? MIN_FORECAST_READINGS;
  if (!f || f.status === "too-few")
    return `No forecast yet: ${readings} of the ${min} readings needed. With fewer, the scatter of the readings cannot be estimated well enough for a 95 % interval to mean anything.`;
  if (f.status === "no-trend") return `No forecast: the ${f.points} readings show no change beyond their own scatter.`;
  if (f.status === "away") return `No forecast: the ${f.points} readings move away from the level.`;
  return `No forecast: at the present rate the level is not reached within ${f.searchYears} years.`;
}

function TrendCards({ trend, len }: { trend: TrendJson; len: Len }) {
  const ef = trend.elongation.forecast;
  const tf = trend.takeUpSeries.forecast;
  return (
    <div className="grid gap-5 lg:grid-cols-2">
      <Card>
        <CardHeader title="Chain elongation" description={`Replacement limit ${trend.settings.elongationLimit} % (common practice for roller chain, no source), warning ${trend.settings.elongationWarning} %.`} />
        <CardBody className="space-y-2">
          <TrendChart title="Elongation, %" unit="%" scale={1} digits={2} points={trend.elongation.points} forecast={ef} limit={trend.settings.elongationLimit} warning={trend.settings.elongationWarning} testId="elongation-chart" />
          <p className="text-[13.5px]" data-testid="elongation-forecast">
            {ef?.crossing ? `Reaches ${trend.settings.elongationLimit} % around ${day(ef.crossing)} (95 %: ${day(ef.earliest)} – ${day(ef.latest)}), from ${ef.points} readings.` : noForecastWords(ef, trend.elongation.points.length)}
          </p>
        </CardBody>
      </Card>
      <Card>
        <CardHeader
          title="Take-up at rest"
          description={`Usable travel ${(trend.takeUp.limit * len.scale).toFixed(len.digits)} ${len.unit} of ${(trend.travel * len.scale).toFixed(len.digits)} ${len.unit}, keeping ${(trend.takeUp.thermalReserve * len.scale).toFixed(len.digits)} ${len.unit} for heat (from ${trend.takeUp.source}).`}
        />
        <CardBody className="space-y-2">
          <TrendChart title={`Position below the top stop, ${len.unit}`} unit={len.unit} scale={len.scale} digits={len.digits} points={trend.takeUpSeries.points} earlier={trend.takeUpSeries.earlier} resets={trend.takeUpSeries.resets} forecast={tf} limit={trend.takeUp.limit} warning={trend.takeUp.warning} testId="take-up-chart" />
          <p className="text-[13.5px]" data-testid="take-up-forecast">
            {tf?.crossing ? `Runs out of travel around ${day(tf.crossing)} (95 %: ${day(tf.earliest)} – ${day(tf.latest)}), from ${tf.points} readings.` : noForecastWords(tf, trend.takeUpSeries.points.length)}
            {trend.takeUpSeries.since ? ` Readings since links were removed on ${day(trend.takeUpSeries.since)}.` : ""}
          </p>
          {trend.takeUp.elasticExcursion !== null && (
            <p className="text-[12.5px] text-steel-500">The weight rises about {(trend.takeUp.elasticExcursion * len.scale).toFixed(len.digits)} {len.unit} when a train loads the chain: keep that much room above it.</p>
          )}
        </CardBody>
      </Card>
      {trend.alerts.length > 0 && (
        <div className="lg:col-span-2">
          <Alert tone="caution" title="Open alerts">
            <ul>
              {trend.alerts.map((a) => (
                <li key={a.id}>
                  <Badge tone={a.level === "limit" ? "fail" : "caution"}>{a.level}</Badge> {a.message}
                </li>
              ))}
            </ul>
          </Alert>
        </div>
      )}
    </div>
  );
}

function EntryForm({ liftId, trend, len, onSaved }: { liftId: number; trend: TrendJson; len: Len; onSaved: (a: AlertJson[]) => void }) {
  const [kind, setKind] = useState<EntryJson["kind"]>("take-up");
  const [v, setV] = useState<Record<string, string>>({ pitches: "20" });
  const [issues, setIssues] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [photo, setPhoto] = useState<File | null>(null);
  const num = (k: string) => (v[k] === undefined || v[k] === "" ? undefined : Number(v[k]));
  const set = (k: string) => (e: { target: { value: string } }) => setV({ ...v, [k]: e.target.value });

  // Lengths are typed in the form's unit (mm or in): problems are said in that unit too, never in metres.
  const lengthIssues = (): Record<string, string> => {
    const out: Record<string, string> = {};
    const fields = kind === "elongation" ? [["measuredLength", "Measured length"]] : kind === "take-up" ? [["position", "Position"]] : [];
    for (const [k, label] of fields) if (num(k) === undefined || !Number.isFinite(num(k)!)) out[k] = `${label} must be a number in ${len.unit}`;
    return out;
  };
  const inFormUnits = (serverIssues: Record<string, string>): Record<string, string> =>
    serverIssues.position ? { ...serverIssues, position: `Position must be within the take-up travel of ${(trend.travel * len.scale).toFixed(len.digits)} ${len.unit}` } : serverIssues;

  const submit = async () => {
    setIssues({});
    setMessage(null);
    const local = lengthIssues();
    if (Object.keys(local).length) {
      setIssues(local);
      setMessage("Check the marked fields.");
      return;
    }
    setBusy(true);
    try {
      const body: Record<string, unknown> = { kind, liftId, notes: v.notes || undefined, measuredAt: v.measuredAt ? new Date(v.measuredAt).toISOString() : undefined };
      if (kind === "elongation") Object.assign(body, { measuredLength: (num("measuredLength") ?? NaN) / len.scale, pitches: num("pitches") });
      if (kind === "take-up") body.position = (num("position") ?? NaN) / len.scale;
      if (kind === "links-removed") body.links = num("links");
      if (kind === "lubrication") body.lubricant = v.lubricant || undefined;
      if (kind === "inspection") {
        body.findings = v.findings ?? "";
        if (photo) {
          const form = new FormData();
          form.set("liftId", String(liftId));
          form.set("file", photo);
          const res = await fetch("/api/uploads", { method: "POST", body: form });
          const j = await res.json();
          if (!res.ok) throw new ApiError(res.status, j.error, j.issues ?? []);
          body.photoIds = [j.id];
        }
      }
      const r = await sendJson<{ alerts: AlertJson[]; computed: Record<string, number | null> }>("/api/logbook/entries", "POST", body);
      if (kind === "links-removed") setMessage(`Saved. The take-up should rise ${((r.computed.rise ?? 0) * len.scale).toFixed(len.digits)} ${len.unit}.`);
      else setMessage("Saved.");
      setV({ pitches: "20" });
      setPhoto(null);
      onSaved(r.alerts);
    } catch (err) {
      if (err instanceof ApiError) {
        setIssues(inFormUnits(issueMap(err.issues)));
        setMessage(err.message);
      } else setMessage(String(err));
    } finally {
      setBusy(false);
    }
  };

  return (
    <Card>
      <CardHeader title="Log an entry" description={`Nominal pitch ${(trend.pitch * len.scale).toFixed(len.digits === 0 ? 1 : 3)} ${len.unit}; take-up travel ${(trend.travel * len.scale).toFixed(len.digits)} ${len.unit}.`} />
      <CardBody>
        <form
          className="grid gap-3 md:grid-cols-3"
          onSubmit={(e) => {
            e.preventDefault();
            void submit();
          }}
          data-testid="entry-form"
        >
          <Field label="Type" name="kind">
            <Select id="kind" value={kind} onChange={(e) => setKind(e.target.value as EntryJson["kind"])}>
              {Object.entries(KIND_LABELS).map(([k, l]) => (
                <option key={k} value={k}>
                  {l}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="When" name="measuredAt" hint="Leave empty for now." error={issues.measuredAt}>
            <Input id="measuredAt" type="datetime-local" value={v.measuredAt ?? ""} onChange={set("measuredAt")} />
          </Field>
          {kind === "elongation" && (
            <>
              <Field label={`Measured length (${len.unit})`} name="measuredLength" error={issues.measuredLength}>
                <Input id="measuredLength" inputMode="decimal" value={v.measuredLength ?? ""} onChange={set("measuredLength")} />
              </Field>
              <Field label="Over pitches" name="pitches" error={issues.pitches}>
                <Input id="pitches" inputMode="numeric" value={v.pitches ?? ""} onChange={set("pitches")} />
              </Field>
            </>
          )}
          {kind === "take-up" && (
            <Field label={`Position below the top stop (${len.unit})`} name="position" error={issues.position}>
              <Input id="position" inputMode="decimal" value={v.position ?? ""} onChange={set("position")} />
            </Field>
          )}
          {kind === "links-removed" && (
            <Field label="Links removed" name="links" error={issues.links}>
              <Input id="links" inputMode="numeric" value={v.links ?? ""} onChange={set("links")} />
            </Field>
          )}
          {kind === "lubrication" && (
            <Field label="Lubricant" name="lubricant">
              <Input id="lubricant" value={v.lubricant ?? ""} onChange={set("lubricant")} />
            </Field>
          )}
          {kind === "inspection" && (
            <>
              <Field label="Findings" name="findings" error={issues.findings} className="md:col-span-2">
                <Input id="findings" value={v.findings ?? ""} onChange={set("findings")} />
              </Field>
              <Field label="Photo (JPEG, PNG, GIF or WebP, ≤ 5 MiB)" name="photo" error={issues.file}>
                <input id="photo" type="file" accept="image/jpeg,image/png,image/gif,image/webp" onChange={(e) => setPhoto(e.target.files?.[0] ?? null)} className="text-[13px]" />
              </Field>
            </>
          )}
          <Field label="Notes" name="notes" className="md:col-span-3">
            <Input id="notes" value={v.notes ?? ""} onChange={set("notes")} />
          </Field>
          <div className="flex items-center gap-3 md:col-span-3">
            <Button type="submit" busy={busy} data-testid="save-entry">
              Save entry
            </Button>
            {message && (
              <span className="text-[13px] text-steel-700" data-testid="entry-message">
                {message}
              </span>
            )}
          </div>
        </form>
      </CardBody>
    </Card>
  );
}

function SettingsForm({ liftId, trend, onSaved }: { liftId: number; trend: TrendJson; onSaved: () => void }) {
  const s = trend.settings;
  const [v, setV] = useState({ elongationLimit: String(s.elongationLimit), elongationWarning: String(s.elongationWarning), takeUpWarning: String(s.takeUpWarning * 100), horizonDays: String(s.horizonDays) });
  const [issues, setIssues] = useState<Record<string, string>>({});
  const [msg, setMsg] = useState<string | null>(null);
  const save = async () => {
    try {
      await sendJson(`/api/logbook/lifts/${liftId}/settings`, "PUT", {
        version: s.version,
        elongationLimit: Number(v.elongationLimit),
        elongationWarning: Number(v.elongationWarning),
        takeUpWarning: Number(v.takeUpWarning) / 100,
        horizonDays: Number(v.horizonDays),
      });
      setIssues({});
      setMsg("Levels saved.");
      onSaved();
    } catch (err) {
      if (err instanceof ApiError) setIssues(issueMap(err.issues));
      setMsg(err instanceof Error ? err.message : String(err));
    }
  };
  const f = (k: keyof typeof v, label: string) => (
    <Field label={label} name={k} error={issues[k]}>
      <Input id={k} inputMode="decimal" value={v[k]} onChange={(e) => setV({ ...v, [k]: e.target.value })} />
    </Field>
  );
  return (
    <Card>
      <CardHeader title="Levels for this lift" description="The replacement limit defaults to 3 % (common practice for roller chain, no source); the manufacturer's figure governs." />
      <CardBody>
        <div className="grid gap-3 md:grid-cols-4">
          {f("elongationLimit", "Elongation limit, %")}
          {f("elongationWarning", "Elongation warning, %")}
          {f("takeUpWarning", "Take-up warning, % of usable travel")}
          {f("horizonDays", "Forecast horizon, days")}
        </div>
        <div className="mt-3 flex items-center gap-3">
          <Button variant="secondary" onClick={() => void save()}>
            Save levels
          </Button>
          {msg && <span className="text-[13px] text-steel-700">{msg}</span>}
        </div>
      </CardBody>
    </Card>
  );
}
