"use client";
/**
 * Create or change a scenario: lift and pinned revision, train and loading, entry conditions, run
 * settings, and the drive model and damping laid over the pinned revision (scenario format 2).
 */
import { useMemo, useRef, useState } from "react";
import { useRouter } from "next/navigation";
import { z } from "zod";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { Input, Select } from "@/components/ui/Field";
import { NumberInput } from "@/components/ui/NumberInput";
import { Section } from "@/components/ui/FormSection";
import { getPath, setPath, type Draft, type FieldDef } from "@/components/ui/form-draft";
import { fieldErrors, type FieldLabel } from "@/lib/client/field-messages";
import type { LiftListItemJson, RevisionListItemJson } from "@/components/lift/types";
import type { TrainJson } from "@/components/train/TrainEditor";
import { ApiError, sendJson } from "@/lib/client/fetch";
import { useList } from "@/lib/client/hooks";
import type { UnitSystem } from "@/lib/client/units";
import { INTEGRATORS, runSettingsSchema, trainSchema, trainSchemaV1 } from "@/sim/schema";
import { scenarioIssueMessage } from "@/lib/scenarios/schema";
import type { Scenario as EngineScenario } from "@/sim";
import { DYNAMICS_FIELDS, DYNAMICS_SECTIONS, dynamicsSchema } from "@/lib/scenarios/dynamics";
import { LOADING_LABELS, type ScenarioJson } from "./types";
import { DynamicsSection, labelledError } from "./DynamicsSection";
import { ALL_DYNAMICS_FIELDS, START_TIME_FIELD } from "./dynamics-fields";
import { followersSchema } from "@/lib/scenarios/followers";
import { TrainsSection, followerLabels } from "./TrainsSection";

const LOADINGS = ["empty", "full", "riders"] as const;

/** The browser's check of the scenario fields: the engine's own field rules (sim/schema.ts). */
const scenarioFormSchema = z.object({
  name: z.string({ error: "name must be text" }).trim().min(1, { error: "name must not be empty" }).max(200, { error: "name must be at most 200 characters" }),
  liftId: z.number({ error: "choose a lift" }).int().positive({ error: "choose a lift" }),
  trainId: z.number({ error: "choose a train" }).int().positive({ error: "choose a train" }),
  loading: z.enum(LOADINGS),
  riderCount: z.number().int().min(0).max(2000).nullish(),
  entrySpeed: trainSchemaV1.shape.entrySpeed,
  startPosition: trainSchemaV1.shape.startPosition,
  startTime: trainSchema.shape.startTime,
  runSettings: runSettingsSchema,
  dynamics: dynamicsSchema,
  followers: followersSchema,
});

/** Every dynamics field, null where the draft has none: the server then drops it (back to the revision's value). */
function dynamicsBody(d: unknown): Record<string, Record<string, unknown>> {
  const src = (d && typeof d === "object" ? d : {}) as Record<string, Record<string, unknown> | undefined>;
  return Object.fromEntries(
    DYNAMICS_SECTIONS.map((sec) => [sec, Object.fromEntries(DYNAMICS_FIELDS[sec].map((k) => [k, src[sec]?.[k] ?? null]))]),
  );
}

const RIDER_FIELD: FieldDef = { path: "riderCount", label: "Riders in the train", q: "count", int: true };

const FIELDS: FieldDef[] = [
  { path: "entrySpeed", label: "Entry speed", q: "speed", hint: "Train speed as it rolls onto the chain" },
  { path: "startPosition", label: "Start position (train front)", q: "length" },
  START_TIME_FIELD,
  { path: "runSettings.duration", label: "Simulated time", q: "time" },
  { path: "runSettings.segments", label: "Chain segments", q: "count", int: true, hint: "More segments: finer waves, slower run" },
];

const BASE_LABELS: FieldLabel[] = [
  ...FIELDS,
  ...ALL_DYNAMICS_FIELDS,
  RIDER_FIELD,
  { path: "name", label: "Name" },
  { path: "liftId", label: "Lift" },
  { path: "liftRevisionId", label: "Pinned revision" },
  { path: "trainId", label: "Train" },
  { path: "loading", label: "Loading" },
  { path: "runSettings.integrator", label: "Integrator" },
  // The engine's names of the stop and restart times, as its cross-field messages spell them.
  { path: "drive.stop.time", label: "Stop at", q: "time" },
  { path: "drive.restart.time", label: "Restart at", q: "time" },
];

/** Labels for messages in words: the fixed fields and those of each following train. */
const formLabels = (followers: unknown): FieldLabel[] => [
  ...BASE_LABELS,
  ...(Array.isArray(followers) ? followers.flatMap((_, i) => followerLabels(i)) : []),
];

export function ScenarioEditor({
  scenario,
  units,
  canWrite,
  engine = null,
}: {
  scenario: ScenarioJson | null;
  units: UnitSystem;
  canWrite: boolean;
  /** The scenario as the engine runs it (for the drive and damping read-outs); null for a new one. */
  engine?: EngineScenario | null;
}) {
  const router = useRouter();
  const [draft, setDraft] = useState<Draft>(() =>
    scenario
      ? {
          name: scenario.name,
          notes: scenario.notes ?? "",
          liftId: scenario.liftId,
          liftRevisionId: scenario.liftRevisionId,
          trainId: scenario.trainId,
          loading: scenario.loading,
          riderCount: scenario.riderCount,
          entrySpeed: scenario.entrySpeed,
          startPosition: scenario.startPosition,
          startTime: scenario.startTime ?? 0,
          runSettings: { duration: 40, segments: 60, ...scenario.runSettings },
          dynamics: scenario.dynamics ?? {},
          // The draft holds the fields the API takes (not the train's name it answers with).
          followers: (scenario.followers ?? []).map((f) => ({
            trainId: f.trainId,
            loading: f.loading,
            ...(f.loading === "riders" ? { riderCount: f.riderCount } : {}),
            entrySpeed: f.entrySpeed,
            startPosition: f.startPosition,
            startTime: f.startTime,
          })),
        }
      : { name: "", notes: "", loading: "full", entrySpeed: 2, startPosition: 14, startTime: 0, runSettings: { duration: 40, segments: 60 }, dynamics: {}, followers: [] },
  );
  const [version, setVersion] = useState(scenario?.version ?? 0);
  const [touched, setTouched] = useState<Set<string>>(new Set());
  const [showAll, setShowAll] = useState(false);
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [banner, setBanner] = useState<{ tone: "success" | "error" | "caution"; title: string; text?: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const inFlight = useRef(false);
  const lifts = useList<LiftListItemJson>("/api/lifts", { pageSize: 100 });
  const trains = useList<TrainJson>("/api/trains", { pageSize: 100 });
  const liftId = draft.liftId as number | undefined;
  const revisions = useList<RevisionListItemJson>(liftId ? `/api/lifts/${liftId}/revisions` : "/api/lifts/0/revisions", { pageSize: 50 }, { isPaused: () => !liftId });

  const errors = useMemo(() => {
    const r = scenarioFormSchema.safeParse(draft);
    return r.success ? {} : fieldErrors(r.error.issues.map((i) => ({ ...i, message: scenarioIssueMessage(i.message, i.path) })), formLabels(draft.followers), units);
  }, [draft, units]);
  const shown = (p: string) => serverErrors[p] ?? (showAll || touched.has(p) ? errors[p] : undefined);
  const set = (p: string, v: unknown) => {
    setDraft((d) => setPath(d, p, v));
    setTouched((t) => new Set(t).add(p));
    setServerErrors((e) => (p in e ? Object.fromEntries(Object.entries(e).filter(([k]) => k !== p)) : e));
  };
  const disabled = !canWrite || busy;

  async function save() {
    // A second click while the first save is in flight must not create a second scenario.
    if (inFlight.current) return;
    setBanner(null);
    if (Object.keys(errors).length) {
      setShowAll(true);
      setBanner({ tone: "error", title: "Some fields need attention", text: "Nothing was saved." });
      return;
    }
    inFlight.current = true;
    setBusy(true);
    // A create that navigates to the new scenario stays busy until the page goes.
    let leaving = false;
    const body: Record<string, unknown> = { ...draft, notes: draft.notes || null, dynamics: dynamicsBody(draft.dynamics) };
    if (body.loading !== "riders") delete body.riderCount;
    if (!body.liftRevisionId) delete body.liftRevisionId;
    try {
      if (!scenario) {
        const created = await sendJson<ScenarioJson>("/api/scenarios", "POST", body);
        leaving = true;
        router.push(`/scenarios/${created.id}`);
        return;
      }
      const saved = await sendJson<ScenarioJson>(`/api/scenarios/${scenario.id}`, "PATCH", { version, ...body });
      setVersion(saved.version);
      setTouched(new Set());
      setBanner({ tone: "success", title: `Saved (version ${saved.version}).` });
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.status === 409)
        setBanner({ tone: "caution", title: "This scenario changed while you were editing", text: `${err.message} Nothing was saved.` });
      else if (err instanceof ApiError && err.status === 400) {
        const words = fieldErrors(err.issues, formLabels(draft.followers), units);
        setServerErrors(words);
        setShowAll(true);
        setBanner({ tone: "error", title: "The server did not accept the scenario", text: Object.values(words).join(" · ") || err.message });
      } else setBanner({ tone: "error", title: err instanceof Error ? err.message : "Saving failed" });
    } finally {
      if (!leaving) {
        inFlight.current = false;
        setBusy(false);
      }
    }
  }

  const selectErr = (p: string) => shown(p) && <p data-testid={`error-${p}`} className="mt-1 text-[12px] font-medium text-fail">{shown(p)}</p>;
  return (
    <form
      className="space-y-4"
      noValidate
      data-testid="scenario-form"
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
    >
      {banner && (
        <Alert tone={banner.tone} testId="save-banner" title={banner.title}>
          {banner.text}
        </Alert>
      )}
      <div className="grid gap-3 rounded-lg border border-steel-300/70 bg-white px-4 py-3.5 sm:grid-cols-2 xl:grid-cols-3">
        <div className="sm:col-span-2 xl:col-span-1">
          <label htmlFor="f-name" className="mb-1 block text-[12.5px] font-semibold text-ink-800">Name</label>
          <Input id="f-name" className="h-9" value={String(draft.name ?? "")} disabled={disabled} invalid={!!shown("name")} onChange={(e) => set("name", e.target.value)} />
          {selectErr("name")}
        </div>
        <div>
          <label htmlFor="f-liftId" className="mb-1 block text-[12.5px] font-semibold text-ink-800">Lift</label>
          <Select id="f-liftId" className="h-9" value={liftId ? String(liftId) : ""} disabled={disabled} onChange={(e) => { set("liftId", e.target.value ? Number(e.target.value) : undefined); set("liftRevisionId", undefined); }}>
            <option value="">Choose a lift</option>
            {lifts.data?.items.map((l) => <option key={l.id} value={l.id}>{l.name}</option>)}
          </Select>
          {selectErr("liftId")}
        </div>
        <div>
          <label htmlFor="f-liftRevisionId" className="mb-1 block text-[12.5px] font-semibold text-ink-800">Pinned revision</label>
          <Select id="f-liftRevisionId" className="h-9" value={draft.liftRevisionId ? String(draft.liftRevisionId) : ""} disabled={disabled || !liftId} onChange={(e) => set("liftRevisionId", e.target.value ? Number(e.target.value) : undefined)}>
            <option value="">The current revision</option>
            {revisions.data?.items.map((r) => <option key={r.id} value={r.id}>r{r.number}{r.current ? " (current)" : ""} · {r.changeSummary ?? "no note"}</option>)}
          </Select>
          {selectErr("liftRevisionId")}
        </div>
        <div>
          <label htmlFor="f-trainId" className="mb-1 block text-[12.5px] font-semibold text-ink-800">Train</label>
          <Select id="f-trainId" className="h-9" value={draft.trainId ? String(draft.trainId) : ""} disabled={disabled} onChange={(e) => set("trainId", e.target.value ? Number(e.target.value) : undefined)}>
            <option value="">Choose a train</option>
            {trains.data?.items.map((t) => <option key={t.id} value={t.id}>{t.name}</option>)}
          </Select>
          {selectErr("trainId")}
        </div>
        <div>
          <label htmlFor="f-loading" className="mb-1 block text-[12.5px] font-semibold text-ink-800">Loading</label>
          <Select id="f-loading" className="h-9" value={String(draft.loading)} disabled={disabled} onChange={(e) => set("loading", e.target.value)}>
            {LOADINGS.map((l) => <option key={l} value={l}>{LOADING_LABELS[l]}</option>)}
          </Select>
        </div>
        {draft.loading === "riders" && (
          <NumberInput def={RIDER_FIELD} units={units} value={draft.riderCount} onChange={(v) => set("riderCount", v)} error={shown("riderCount")} disabled={disabled} />
        )}
        <div>
          <label htmlFor="f-integrator" className="mb-1 block text-[12.5px] font-semibold text-ink-800">Integrator</label>
          <Select id="f-integrator" className="h-9" value={String(getPath(draft, "runSettings.integrator") ?? "verlet")} disabled={disabled} onChange={(e) => set("runSettings.integrator", e.target.value)}>
            {INTEGRATORS.map((i) => <option key={i} value={i}>{i === "verlet" ? "Verlet (fast, default)" : "odex (reference)"}</option>)}
          </Select>
        </div>
      </div>
      <Section title="Entry and run settings">
        {FIELDS.map((f) => (
          <NumberInput key={`${f.path}-${units}`} def={f} units={units} value={getPath(draft, f.path)} onChange={(v) => set(f.path, v)} error={f === START_TIME_FIELD ? labelledError(f, units, shown(f.path)) : shown(f.path)} disabled={disabled} />
        ))}
      </Section>
      <TrainsSection draft={draft} set={set} shown={shown} units={units} disabled={disabled} trains={trains.data?.items ?? []} />
      <DynamicsSection draft={draft} set={set} shown={shown} units={units} disabled={disabled} engine={engine} />
      {canWrite && (
        <Button type="submit" busy={busy} data-testid="save-scenario">
          {scenario ? "Save scenario" : "Create scenario"}
        </Button>
      )}
    </form>
  );
}
