"use client";
/**
 * Logger upload in three steps: choose the file, map its columns with the unit of each (read from the
 * header, correctable), check (every problem listed, nothing stored; a preview table and plot of what
 * will be stored) and store. The browser reads the file; the server checks it again with the same parser.
 */
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import Papa from "papaparse";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { Field, Input, Options, Select } from "@/components/ui/Field";
import { Table, THead, Td, Th, Tr } from "@/components/ui/Table";
import { ApiError, sendJson, type FieldIssue } from "@/lib/client/fetch";
import { formatQuantity, unitOf, type Quantity, type UnitSystem } from "@/lib/client/units";
import { QUANTITY_OF, UNIT_CHOICES, resolveUnits, suggestMapping, type ChannelKey } from "@/lib/recordings/headers";
import type { PreviewAnswer } from "@/lib/recordings/service";
import { CHANNEL_LABELS, CHANNELS, RECORDING_MAX_BYTES, type Channel } from "@/lib/recordings/schema";
import { OverlayChart } from "./OverlayChart";

const KEYS: ChannelKey[] = ["time", ...CHANNELS];
/** How each stored channel is shown in the preview, in the reader's system. */
const SHOWN_AS: Record<Channel, Quantity | null> = { takeUpPosition: "smallLength", chainTension: "force", driveCurrent: null, trainPosition: "length", trainSpeed: "speed" };
const COLOURS = ["#1f6fb2", "#b3261e", "#2e7d32", "#6a3fa0", "#8a5a00"];

export function UploadWizard({ lifts, liftId: initialLift, units: system }: { lifts: { id: number; name: string }[]; liftId: number; units: UnitSystem }) {
  const router = useRouter();
  const [liftId, setLiftId] = useState(initialLift);
  const [csv, setCsv] = useState<string | null>(null);
  const [fileName, setFileName] = useState("");
  const [name, setName] = useState("");
  const [headers, setHeaders] = useState<string[]>([]);
  const [mapping, setMapping] = useState<Partial<Record<ChannelKey, string>>>({});
  const [columnUnits, setColumnUnits] = useState<Partial<Record<ChannelKey, string>>>({});
  const [takeUpDirection, setTakeUpDirection] = useState<"down" | "up">("down");
  const [engagement, setEngagement] = useState("");
  const [issues, setIssues] = useState<FieldIssue[]>([]);
  const [message, setMessage] = useState<string | null>(null);
  const [checked, setChecked] = useState<PreviewAnswer | null>(null);
  const [busy, setBusy] = useState(false);
  // What the header says for each mapped column; a unit the user picks replaces it.
  const fromHeader = useMemo(() => resolveUnits(mapping, {}).columns, [mapping]);

  const pick = async (f: File | undefined) => {
    setIssues([]);
    setChecked(null);
    setMessage(null);
    setEngagement("");
    setColumnUnits({});
    if (!f) return;
    if (f.size > RECORDING_MAX_BYTES) {
      setMessage(`The file is ${f.size} bytes; at most ${RECORDING_MAX_BYTES}.`);
      return;
    }
    const text = await f.text();
    const h = ((Papa.parse<string[]>(text, { preview: 1 }).data[0] ?? []) as string[]).map((x) => String(x).trim());
    setCsv(text);
    setFileName(f.name);
    // Each file gets its own name: the previous file's name is never kept.
    setName(f.name.replace(/\.[^.]+$/, ""));
    setHeaders(h);
    setMapping(suggestMapping(h));
  };

  const send = async (dryRun: boolean) => {
    if (!csv) return;
    setBusy(true);
    setIssues([]);
    try {
      const mapped = Object.fromEntries(Object.entries(mapping).filter(([, v]) => v)) as Partial<Record<ChannelKey, string>>;
      const body = {
        liftId,
        name,
        fileName,
        csv,
        mapping: mapped,
        units: { takeUpDirection },
        columnUnits: Object.fromEntries(Object.entries(columnUnits).filter(([k, v]) => v && mapped[k as ChannelKey])),
        ...(engagement ? { engagementTime: Number(engagement) } : {}),
        dryRun,
      };
      const r = await sendJson<PreviewAnswer | { recording: { id: number } }>("/api/recordings", "POST", body);
      if ("recording" in r) router.push(`/logbook/recordings/${r.recording.id}`);
      else {
        setChecked(r);
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

  const change = (fn: () => void) => {
    fn();
    setChecked(null);
  };

  return (
    <div className="space-y-5" data-testid="upload-wizard">
      <Card>
        <CardHeader title="1 · The file" description={`A CSV with a header row: time plus any of take-up position, chain tension, drive current, train position or speed. Units in the headers (e.g. "Time [ms]", "Tension (kN)") are read. At most ${Math.round(RECORDING_MAX_BYTES / 1024)} KiB.`} />
        <CardBody className="grid gap-3 md:grid-cols-3">
          <Field label="Lift" name="lift">
            <Select id="lift" value={liftId} onChange={(e) => setLiftId(Number(e.target.value))}>
              <Options items={lifts} label={(l) => l.name} />
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
          <CardHeader title="2 · Columns and units" description="Say which column is which and what unit it is in; leave out what the logger did not record." />
          <CardBody className="space-y-3">
            <div className="grid gap-x-3 gap-y-2 md:grid-cols-[minmax(0,1fr)_minmax(0,1fr)_10rem]">
              {KEYS.map((k) => {
                const q = QUANTITY_OF[k];
                const said = fromHeader[k];
                const unit = columnUnits[k] ?? said?.unit ?? "";
                return (
                  <div key={k} className="contents">
                    <Field label={CHANNEL_LABELS[k]} name={`map-${k}`}>
                      <Select id={`map-${k}`} value={mapping[k] ?? ""} onChange={(e) => change(() => setMapping({ ...mapping, [k]: e.target.value || undefined }))}>
                        <option value="">{k === "time" ? "Choose the time column" : "Not recorded"}</option>
                        {headers.map((h) => (
                          <option key={h} value={h}>
                            {h}
                          </option>
                        ))}
                      </Select>
                    </Field>
                    <p className="self-end pb-2 text-[12.5px] text-steel-600" data-testid={`unit-source-${k}`}>
                      {!mapping[k]
                        ? ""
                        : columnUnits[k]
                          ? `Read in ${columnUnits[k]} (your choice).`
                          : said?.from === "header"
                            ? `The header says ${said.unit}.`
                            : said
                              ? `The header names no unit: ${said.unit} assumed. Check it.`
                              : "The header names a unit Tautline does not read: choose one."}
                    </p>
                    <Field label="Unit" name={`unit-${k}`}>
                      <Select id={`unit-${k}`} disabled={!mapping[k]} value={mapping[k] ? unit : ""} onChange={(e) => change(() => setColumnUnits({ ...columnUnits, [k]: e.target.value }))}>
                        {!unit && <option value="">Choose</option>}
                        {UNIT_CHOICES[q].map((u) => (
                          <option key={u} value={u}>
                            {u}
                          </option>
                        ))}
                      </Select>
                    </Field>
                  </div>
                );
              })}
            </div>
            <div className="grid gap-3 md:grid-cols-3">
              <Field label="Take-up reading grows when the weight moves" name="u-dir">
                <Select id="u-dir" value={takeUpDirection} onChange={(e) => change(() => setTakeUpDirection(e.target.value as "down" | "up"))}>
                  <option value="down">down</option>
                  <option value="up">up</option>
                </Select>
              </Field>
              <Field label="Engagement time, s (optional)" name="engagement" hint="When the dog picks up the train; found from the train speed if left empty.">
                <Input id="engagement" inputMode="decimal" value={engagement} onChange={(e) => change(() => setEngagement(e.target.value))} />
              </Field>
            </div>
          </CardBody>
        </Card>
      )}
      {csv && (
        <Card>
          <CardHeader title="3 · Check and store" description="Nothing is stored until the file passes the check and you have looked at what was read." />
          <CardBody className="space-y-3">
            <div className="flex gap-3">
              <Button variant="secondary" busy={busy} onClick={() => void send(true)} data-testid="check-recording">
                Check the file
              </Button>
              <Button busy={busy} disabled={!checked} onClick={() => void send(false)} data-testid="store-recording">
                Store the recording
              </Button>
            </div>
            {checked && <Preview answer={checked} system={system} />}
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

/** What will be stored: the units each column was read in, the first rows and a small plot, in the reader's units. */
function Preview({ answer, system }: { answer: PreviewAnswer; system: UnitSystem }) {
  const show = (c: Channel, si: number | null) => {
    const q = SHOWN_AS[c];
    if (si === null) return "—";
    return q ? formatQuantity(si, q, system) : `${si.toFixed(1)} A`;
  };
  const head = (c: Channel) => `${CHANNEL_LABELS[c]}, ${SHOWN_AS[c] ? unitOf(SHOWN_AS[c]!, system).label : "A"}`;
  const readIn = Object.entries(answer.units)
    .map(([k, u]) => `${CHANNEL_LABELS[k as ChannelKey]} in ${u.unit}${u.from === "assumed" ? " (assumed)" : u.from === "header" ? " (from the header)" : ""}`)
    .join("; ");
  return (
    <div className="space-y-3" data-testid="recording-preview">
      <Alert tone="success" testId="recording-checked">
        {answer.rowCount} rows read without problems. {readIn}.
        {answer.delimiter !== "," ? ` Fields separated by "${answer.delimiter}".` : ""}
        {answer.decimalComma ? " Numbers use a decimal comma." : ""}{" "}
        {answer.engagementTime !== null ? `Engagement at ${answer.engagementTime.toFixed(2)} s.` : "No engagement time: the overlay will align at the start."}
      </Alert>
      <Table>
        <THead>
          <Tr>
            <Th>Time, s</Th>
            {answer.channels.map((c) => (
              <Th key={c}>{head(c)}</Th>
            ))}
          </Tr>
        </THead>
        <tbody data-testid="preview-rows">
          {answer.preview.slice(0, 8).map((s, i) => (
            <Tr key={i}>
              <Td>{s.t.toFixed(3)}</Td>
              {answer.channels.map((c) => (
                <Td key={c}>{show(c, s[c])}</Td>
              ))}
            </Tr>
          ))}
        </tbody>
      </Table>
      <div className="grid gap-3 md:grid-cols-2">
        {answer.channels.map((c, i) => {
          const q = SHOWN_AS[c];
          const u = q ? unitOf(q, system) : { label: "A", factor: 1 };
          return (
            <figure key={c} className="space-y-1">
              <figcaption className="text-[12.5px] font-semibold text-ink-800">{head(c)}</figcaption>
              <OverlayChart traces={[{ label: CHANNEL_LABELS[c], t: answer.plot.map((s) => s.t), y: answer.plot.map((s) => s[c]), colour: COLOURS[i % COLOURS.length] }]} unit={u.label} scale={u.factor} height={130} testId={`preview-plot-${c}`} />
            </figure>
          );
        })}
      </div>
    </div>
  );
}
