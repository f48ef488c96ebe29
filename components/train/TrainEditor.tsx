"use client";
/** Create or change a train: fields in the user's units, messages from the shared train schema, version sent on save. */
import { useMemo, useState } from "react";
import { useRouter } from "next/navigation";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { Input } from "@/components/ui/Field";
import { NumberField, Section } from "@/components/lift/NumberField";
import { getPath, setPath, zodErrors, type Draft, type FieldDef } from "@/components/lift/form-model";
import { ApiError, issueMap, sendJson } from "@/lib/client/fetch";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { trainInputSchema, trainIssues } from "@/lib/trains/schema";
import { PawlsField } from "./PawlsField";

export interface TrainJson {
  id: number;
  name: string;
  notes: string | null;
  cars: number;
  carMassEmpty: number;
  seatsPerCar: number;
  riderMass: number;
  carLength: number;
  dogOffset: number;
  rollingResistance: number;
  dragArea: number;
  /** m behind the front; null = one pawl at the dog. */
  pawls: number[] | null;
  carMassLoaded: number;
  version: number;
  archivedAt: string | null;
  updatedAt: string;
}

export const TRAIN_FIELDS: FieldDef[] = [
  { path: "cars", label: "Cars", q: "count", int: true },
  { path: "carMassEmpty", label: "Empty car mass", q: "mass" },
  { path: "seatsPerCar", label: "Seats per car", q: "count", int: true },
  { path: "riderMass", label: "Mass per rider", q: "mass", hint: "75 kg default: an assumption" },
  { path: "carLength", label: "Car length", q: "length", hint: "Coupling to coupling" },
  { path: "dogOffset", label: "Dog behind the nose", q: "length", hint: "Where the chain dog sits" },
  { path: "rollingResistance", label: "Rolling resistance", q: "ratio" },
  { path: "dragArea", label: "Drag area", q: "area" },
];

export const NEW_TRAIN: Draft = { name: "", notes: "", cars: 6, carMassEmpty: 1000, seatsPerCar: 4, riderMass: 75, carLength: 2.6, dogOffset: 1.3, rollingResistance: 0.015, dragArea: 1 };

export function TrainEditor({ train, units, canWrite }: { train: TrainJson | null; units: UnitSystem; canWrite: boolean }) {
  const router = useRouter();
  const [draft, setDraft] = useState<Draft>(() =>
    train
      ? Object.fromEntries(["name", "notes", "pawls", ...TRAIN_FIELDS.map((f) => f.path)].map((k) => [k, (train as unknown as Draft)[k] ?? (k === "notes" ? "" : undefined)]))
      : { ...NEW_TRAIN },
  );
  const [version, setVersion] = useState(train?.version ?? 0);
  const [touched, setTouched] = useState<Set<string>>(new Set());
  const [showAll, setShowAll] = useState(false);
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [banner, setBanner] = useState<{ tone: "success" | "error" | "caution"; title: string; text?: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const errors = useMemo(() => {
    const r = trainInputSchema.safeParse({ ...draft, notes: draft.notes || null });
    return r.success ? {} : zodErrors(trainIssues(r.error.issues));
  }, [draft]);
  const shown = (p: string) => serverErrors[p] ?? (showAll || touched.has(p) ? errors[p] : undefined);
  const set = (p: string, v: unknown) => {
    setDraft((d) => setPath(d, p, v));
    setTouched((t) => new Set(t).add(p));
    setServerErrors((e) => (p in e ? Object.fromEntries(Object.entries(e).filter(([k]) => k !== p)) : e));
  };
  const disabled = !canWrite || busy;
  const loaded = typeof draft.carMassEmpty === "number" && typeof draft.seatsPerCar === "number" && typeof draft.riderMass === "number"
    ? (draft.carMassEmpty as number) + (draft.seatsPerCar as number) * (draft.riderMass as number)
    : null;

  async function save() {
    setBanner(null);
    if (Object.keys(errors).length) {
      setShowAll(true);
      setBanner({ tone: "error", title: "Some fields need attention", text: "Nothing was saved." });
      return;
    }
    setBusy(true);
    const body = { ...draft, notes: draft.notes || null };
    try {
      if (!train) {
        const created = await sendJson<TrainJson>("/api/trains", "POST", body);
        router.push(`/trains/${created.id}`);
        return;
      }
      const saved = await sendJson<TrainJson>(`/api/trains/${train.id}`, "PATCH", { version, ...body });
      setVersion(saved.version);
      setTouched(new Set());
      setShowAll(false);
      setBanner({ tone: "success", title: `Saved (version ${saved.version}).` });
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.status === 409)
        setBanner({ tone: "caution", title: "Someone else saved this train while you were editing", text: `${err.message} Nothing was saved; reload the page to see their change.` });
      else if (err instanceof ApiError && err.status === 400) {
        setServerErrors(issueMap(err.issues));
        setShowAll(true);
        setBanner({ tone: "error", title: "The server did not accept the train", text: err.message });
      } else setBanner({ tone: "error", title: err instanceof Error ? err.message : "Saving failed" });
    } finally {
      setBusy(false);
    }
  }

  return (
    <form
      className="max-w-4xl space-y-4"
      noValidate
      data-testid="train-form"
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
    >
      {!canWrite && (
        <Alert tone="info" testId="read-only-note" title="Read only">
          Your role may read this train but not change it.
        </Alert>
      )}
      {banner && (
        <Alert tone={banner.tone} testId="save-banner" title={banner.title}>
          {banner.text}
        </Alert>
      )}
      <div className="grid gap-3 rounded-lg border border-steel-300/70 bg-white px-4 py-3.5 sm:grid-cols-2">
        <div>
          <label htmlFor="f-name" className="mb-1 block text-[12.5px] font-semibold text-ink-800">
            Name
          </label>
          <Input id="f-name" className="h-9" value={String(draft.name ?? "")} disabled={disabled} invalid={!!shown("name")} onChange={(e) => set("name", e.target.value)} />
          {shown("name") && <p data-testid="error-name" className="mt-1 text-[12px] font-medium text-fail">{shown("name")}</p>}
        </div>
        <div>
          <label htmlFor="f-notes" className="mb-1 block text-[12.5px] font-semibold text-ink-800">
            Notes
          </label>
          <Input id="f-notes" className="h-9" value={String(draft.notes ?? "")} disabled={disabled} onChange={(e) => set("notes", e.target.value)} />
        </div>
      </div>
      <Section title="Cars and riders" description={loaded !== null ? `A full car weighs ${formatQuantity(loaded, "mass", units)}.` : undefined}>
        {TRAIN_FIELDS.map((f) => (
          <NumberField key={`${f.path}-${units}`} def={f} units={units} value={getPath(draft, f.path)} onChange={(v) => set(f.path, v)} error={shown(f.path)} disabled={disabled} />
        ))}
        <PawlsField
          key={`pawls-${units}`}
          value={draft.pawls as number[] | null | undefined}
          units={units}
          onChange={(v) => set("pawls", v)}
          error={shown("pawls") ?? Object.entries(serverErrors).concat(showAll || touched.has("pawls") ? Object.entries(errors) : []).find(([k]) => k.startsWith("pawls."))?.[1]}
          disabled={disabled}
        />
      </Section>
      {canWrite && (
        <div className="flex items-center gap-3">
          <Button type="submit" busy={busy} data-testid="save-train">
            {train ? "Save train" : "Create train"}
          </Button>
          {train && <span className="text-[12.5px] text-steel-500">Editing version {version}</span>}
        </div>
      )}
    </form>
  );
}
