"use client";
/**
 * Logger upload in three steps: choose the file, map its columns and units, check (every problem listed,
 * nothing stored) and store. The browser reads the file; the server checks it again with the same parser.
 */
import { useRouter } from "next/navigation";
import { useState } from "react";
import Papa from "papaparse";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { Field, Input, Select } from "@/components/ui/Field";
import { ApiError, sendJson, type FieldIssue } from "@/lib/client/fetch";
import { CHANNEL_LABELS, CHANNELS, RECORDING_MAX_BYTES } from "@/lib/recordings/schema";

type Key = "time" | (typeof CHANNELS)[number];
const KEYS: Key[] = ["time", ...CHANNELS];
const GUESS: Record<Key, RegExp> = {
  time: /^(t|time|zeit|sec|s|time_s|ms)\b/i,
  takeUpPosition: /take.?up|counterweight|tu/i,
  chainTension: /tension|load|force/i,
  driveCurrent: /current|amp/i,
  trainPosition: /position|pos|distance/i,
  trainSpeed: /speed|velocity|vel/i,
};

export function UploadWizard({ lifts, liftId: initialLift }: { lifts: { id: number; name: string }[]; liftId: number }) {
  const router = useRouter();
  const [liftId, setLiftId] = useState(initialLift);
  const [csv, setCsv] = useState<string | null>(null);
  const [fileName, setFileName] = useState("");
  const [name, setName] = useState("");
  const [headers, setHeaders] = useState<string[]>([]);
  const [mapping, setMapping] = useState<Partial<Record<Key, string>>>({});
  const [units, setUnits] = useState({ time: "s", length: "mm", force: "N", speed: "m/s", takeUpDirection: "down" });
  const [engagement, setEngagement] = useState("");
  const [issues, setIssues] = useState<FieldIssue[]>([]);
  const [message, setMessage] = useState<string | null>(null);
  const [checked, setChecked] = useState<{ rowCount: number; engagementTime: number | null } | null>(null);
  const [busy, setBusy] = useState(false);

  const pick = async (f: File | undefined) => {
    setIssues([]);
    setChecked(null);
    setMessage(null);
    if (!f) return;
    if (f.size > RECORDING_MAX_BYTES) {
      setMessage(`The file is ${f.size} bytes; at most ${RECORDING_MAX_BYTES}.`);
      return;
    }
    const text = await f.text();
    const h = ((Papa.parse<string[]>(text, { preview: 1 }).data[0] ?? []) as string[]).map((x) => String(x).trim());
    setCsv(text);
    setFileName(f.name);
    setName((n) => n || f.name.replace(/\.[^.]+$/, ""));
    setHeaders(h);
    const m: Partial<Record<Key, string>> = {};
    for (const k of KEYS) {
      const hit = h.find((x) => GUESS[k].test(x) && !Object.values(m).includes(x));
      if (hit) m[k] = hit;
    }
    setMapping(m);
  };

  const send = async (dryRun: boolean) => {
    if (!csv) return;
    setBusy(true);
    setIssues([]);
    try {
      const body = {
        liftId,
        name,
        fileName,
        csv,
        mapping: Object.fromEntries(Object.entries(mapping).filter(([, v]) => v)),
        units,
        ...(engagement ? { engagementTime: Number(engagement) } : {}),
        dryRun,
      };
      const r = await sendJson<{ rowCount?: number; engagementTime?: number | null; recording?: { id: number } }>("/api/recordings", "POST", body);
      if (r.recording) router.push(`/logbook/recordings/${r.recording.id}`);
      else {
        setChecked({ rowCount: r.rowCount ?? 0, engagementTime: r.engagementTime ?? null });
        setMessage(null);
      }
    } catch (err) {
      setChecked(null);
      if (err instanceof ApiError) {
        setIssues(err.issues);
        setMessage(err.message);
      } else setMessage(String(err));
    } finally {
      setBusy(false);
    }
  };

  const sel = (k: string, value: string, options: string[], onChange: (v: string) => void, label: string) => (
    <Field label={label} name={k}>
      <Select id={k} value={value} onChange={(e) => onChange(e.target.value)}>
        {options.map((o) => (
          <option key={o} value={o}>
            {o}
          </option>
        ))}
      </Select>
    </Field>
  );

  return (
    <div className="space-y-5" data-testid="upload-wizard">
      <Card>
        <CardHeader title="1 · The file" description={`A CSV with a header row: time plus any of take-up position, chain tension, drive current, train position or speed. At most ${Math.round(RECORDING_MAX_BYTES / 1024)} KiB.`} />
        <CardBody className="grid gap-3 md:grid-cols-3">
          <Field label="Lift" name="lift">
            <Select id="lift" value={liftId} onChange={(e) => setLiftId(Number(e.target.value))}>
              {lifts.map((l) => (
                <option key={l.id} value={l.id}>
                  {l.name}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Logger file" name="file">
            <input id="file" type="file" accept=".csv,text/csv" onChange={(e) => void pick(e.target.files?.[0])} className="text-[13px]" />
          </Field>
          <Field label="Name" name="name">
            <Input id="name" value={name} onChange={(e) => setName(e.target.value)} />
          </Field>
        </CardBody>
      </Card>
      {headers.length > 0 && (
        <Card>
          <CardHeader title="2 · Columns and units" description="Say which column is which; leave out what the logger did not record." />
          <CardBody className="grid gap-3 md:grid-cols-3">
            {KEYS.map((k) => (
              <Field key={k} label={CHANNEL_LABELS[k]} name={`map-${k}`}>
                <Select id={`map-${k}`} value={mapping[k] ?? ""} onChange={(e) => setMapping({ ...mapping, [k]: e.target.value || undefined })}>
                  <option value="">{k === "time" ? "Choose the time column" : "Not recorded"}</option>
                  {headers.map((h) => (
                    <option key={h} value={h}>
                      {h}
                    </option>
                  ))}
                </Select>
              </Field>
            ))}
            {sel("u-time", units.time, ["s", "ms"], (v) => setUnits({ ...units, time: v }), "Time unit")}
            {sel("u-length", units.length, ["m", "mm", "in", "ft"], (v) => setUnits({ ...units, length: v }), "Length unit")}
            {sel("u-force", units.force, ["N", "kN", "lbf"], (v) => setUnits({ ...units, force: v }), "Force unit")}
            {sel("u-speed", units.speed, ["m/s", "km/h", "ft/s", "mph"], (v) => setUnits({ ...units, speed: v }), "Speed unit")}
            {sel("u-dir", units.takeUpDirection, ["down", "up"], (v) => setUnits({ ...units, takeUpDirection: v }), "Take-up reading grows when the weight moves")}
            <Field label="Engagement time, s (optional)" name="engagement" hint="When the dog picks up the train; found from the train speed if left empty.">
              <Input id="engagement" inputMode="decimal" value={engagement} onChange={(e) => setEngagement(e.target.value)} />
            </Field>
          </CardBody>
        </Card>
      )}
      {csv && (
        <Card>
          <CardHeader title="3 · Check and store" description="Nothing is stored until the file passes the check." />
          <CardBody className="space-y-3">
            <div className="flex gap-3">
              <Button variant="secondary" busy={busy} onClick={() => void send(true)} data-testid="check-recording">
                Check the file
              </Button>
              <Button busy={busy} disabled={!checked} onClick={() => void send(false)} data-testid="store-recording">
                Store the recording
              </Button>
            </div>
            {checked && (
              <Alert tone="success" testId="recording-checked">
                {checked.rowCount} rows read without problems.{" "}
                {checked.engagementTime !== null ? `Engagement at ${checked.engagementTime.toFixed(2)} s.` : "No engagement time: the overlay will align at the start."}
              </Alert>
            )}
            {message && (
              <Alert tone="error" title={message} testId="recording-problems">
                <ul className="max-h-64 list-disc overflow-auto pl-5">
                  {issues.map((i, k) => (
                    <li key={k}>
                      <code className="text-[12px]">{i.path}</code>: {i.message}
                    </li>
                  ))}
                </ul>
              </Alert>
            )}
          </CardBody>
        </Card>
      )}
    </div>
  );
}
