"use client";
/** Create or change a train: fields in the user's units, messages from the shared train schema, version sent on save. */
import { useState } from "react";
import { useRouter } from "next/navigation";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { Input } from "@/components/ui/Field";
import { NumberInput } from "@/components/ui/NumberInput";
import { Section } from "@/components/ui/FormSection";
import { getPath, type Draft, type FieldDef } from "@/components/ui/form-draft";
import { useSchemaForm } from "@/components/ui/useSchemaForm";
import { ApiError, sendJson } from "@/lib/client/fetch";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { trainInputSchema } from "@/lib/trains/schema";
import { PawlsField } from "./PawlsField";
import type { TrainView } from "@/lib/trains/service";
import type { Jsonify } from "@/lib/client/jsonify";

/** A train as the API answers it. */
export type TrainJson = Jsonify<TrainView>;

export const TRAIN_FIELDS: FieldDef[] = [
  { path: "cars", label: "Cars", q: "count", int: true },
  { path: "carMassEmpty", label: "Empty car mass", q: "mass" },
  { path: "seatsPerCar", label: "Seats per car", q: "count", int: true },
  { path: "riderMass", label: "Mass per rider", q: "mass", hint: "The default is an assumption (no source)" },
  { path: "carLength", label: "Car length", q: "length", hint: "Coupling to coupling" },
  { path: "dogOffset", label: "Dog behind the nose", q: "length", hint: "Where the chain dog sits" },
  { path: "rollingResistance", label: "Rolling resistance", q: "ratio" },
  { path: "dragArea", label: "Drag area", q: "area" },
];

export const NEW_TRAIN: Draft = { name: "", notes: "", cars: 6, carMassEmpty: 1000, seatsPerCar: 4, riderMass: 75, carLength: 2.6, dogOffset: 1.3, rollingResistance: 0.015, dragArea: 1 };

export function TrainEditor({ train, units, canWrite }: { train: TrainJson | null; units: UnitSystem; canWrite: boolean }) {
  const router = useRouter();
  const form = useSchemaForm({
    schema: trainInputSchema,
    initial: () =>
      train
        ? Object.fromEntries(["name", "notes", "pawls", ...TRAIN_FIELDS.map((f) => f.path)].map((k) => [k, (train as unknown as Draft)[k] ?? (k === "notes" ? "" : undefined)]))
        : { ...NEW_TRAIN },
    fields: [{ path: "name", label: "Name" }, { path: "notes", label: "Notes" }, ...TRAIN_FIELDS],
    units,
    prepare: (d) => ({ ...d, notes: d.notes || null }),
  });
  const { draft, set, shown, busy } = form;
  const [version, setVersion] = useState(train?.version ?? 0);
  const [banner, setBanner] = useState<{ tone: "success" | "error" | "caution"; title: string; text?: string } | null>(null);
  const disabled = !canWrite || busy;
  const loaded = typeof draft.carMassEmpty === "number" && typeof draft.seatsPerCar === "number" && typeof draft.riderMass === "number"
    ? (draft.carMassEmpty as number) + (draft.seatsPerCar as number) * (draft.riderMass as number)
    : null;

  async function save() {
    setBanner(null);
    const body = { ...draft, notes: draft.notes || null };
    try {
      const outcome = await form.submit(async () => {
        if (!train) {
          const created = await sendJson<TrainJson>("/api/trains", "POST", body);
          router.push(`/trains/${created.id}`);
          return "leaving";
        }
        const saved = await sendJson<TrainJson>(`/api/trains/${train.id}`, "PATCH", { version, ...body });
        setVersion(saved.version);
        form.settle();
        setBanner({ tone: "success", title: `Saved (version ${saved.version}).` });
        router.refresh();
      });
      if (outcome === "invalid") setBanner({ tone: "error", title: "Some fields need attention", text: "Each says why beside it. Nothing was saved." });
      if (outcome === "rejected") setBanner({ tone: "error", title: "The server did not accept the train", text: ["Each field says why beside it. Nothing was saved.", ...form.unplaced].join(" ") });
    } catch (err) {
      if (err instanceof ApiError && err.status === 409)
        setBanner({ tone: "caution", title: "Someone else saved this train while you were editing", text: `${err.message} Nothing was saved; reload the page to see their change.` });
      else setBanner({ tone: "error", title: err instanceof Error ? err.message : "Saving failed" });
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
          <NumberInput key={`${f.path}-${units}`} def={f} units={units} value={getPath(draft, f.path)} onChange={(v) => set(f.path, v)} error={shown(f.path)} disabled={disabled} />
        ))}
        <PawlsField
          key={`pawls-${units}`}
          value={draft.pawls as number[] | null | undefined}
          units={units}
          onChange={(v) => set("pawls", v)}
          error={shown("pawls") ?? Object.keys(form.errors).filter((k) => k.startsWith("pawls.")).map(shown).find(Boolean)}
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
