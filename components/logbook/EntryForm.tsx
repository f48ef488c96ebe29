"use client";
/** Logging one entry (reading, reset, lubrication, inspection with a photo); lengths in the form's unit. */
import { useState } from "react";
import { Button } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { Field, Input, Select } from "@/components/ui/Field";
import { ApiError, issueMap, newIdempotencyKey, sendJson } from "@/lib/client/fetch";
import { KIND_LABELS, type AlertJson, type EntryJson, type Len, type TrendJson } from "./types";
import { readTyped, type TypedField } from "./typed";

export function EntryForm({ liftId, trend, len, onSaved }: { liftId: number; trend: TrendJson; len: Len; onSaved: (a: AlertJson[]) => void }) {
  const [kind, setKind] = useState<EntryJson["kind"]>("take-up");
  const [v, setV] = useState<Record<string, string>>({ pitches: "20" });
  const [issues, setIssues] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [photo, setPhoto] = useState<File | null>(null);
  // One key per entry being written: Save pressed again after a lost answer cannot store it twice.
  const [writeKey, setWriteKey] = useState(newIdempotencyKey);
  const set = (k: string) => (e: { target: { value: string } }) => setV({ ...v, [k]: e.target.value });

  // Numbers are read by the shared parser; lengths are typed in the form's unit (mm or in) and problems are
  // said in that unit too, never in metres.
  const numberFields = (): TypedField[] =>
    kind === "elongation"
      ? [
          { key: "measuredLength", label: "Measured length", unit: len.unit, required: true },
          { key: "pitches", label: "Over pitches", unit: "pitches" },
        ]
      : kind === "take-up"
        ? [{ key: "position", label: "Position", unit: len.unit, required: true }]
        : kind === "links-removed"
          ? [{ key: "links", label: "Links removed", unit: "links" }]
          : [];
  const inFormUnits = (serverIssues: Record<string, string>): Record<string, string> =>
    serverIssues.position ? { ...serverIssues, position: `Position must be within the take-up travel of ${(trend.travel * len.scale).toFixed(len.digits)} ${len.unit}` } : serverIssues;

  const submit = async () => {
    setIssues({});
    setMessage(null);
    const { values: num, issues: local } = readTyped(v, numberFields());
    if (Object.keys(local).length) {
      setIssues(local);
      setMessage("Check the marked fields.");
      return;
    }
    setBusy(true);
    try {
      const body: Record<string, unknown> = { kind, liftId, notes: v.notes || undefined, measuredAt: v.measuredAt ? new Date(v.measuredAt).toISOString() : undefined };
      if (kind === "elongation") Object.assign(body, { measuredLength: (num.measuredLength ?? NaN) / len.scale, pitches: num.pitches });
      if (kind === "take-up") body.position = (num.position ?? NaN) / len.scale;
      if (kind === "links-removed") body.links = num.links;
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
      const r = await sendJson<{ alerts: AlertJson[]; computed: Record<string, number | null> }>("/api/logbook/entries", "POST", body, { idempotencyKey: writeKey });
      setWriteKey(newIdempotencyKey());
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
