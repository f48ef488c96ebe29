"use client";
/**
 * Create or revise a lift: grouped fields in the user's units with inline messages from the shared
 * schema, the chain picked from the catalogue, a live side elevation, and a save that sends the version
 * it edits (a stale save answers 409 and is shown as such; nothing is lost from the form).
 */
import { useMemo, useState } from "react";
import { useRouter } from "next/navigation";
import { useSWRConfig } from "swr";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { Input, Select } from "@/components/ui/Field";
import { ApiError, issueMap, sendJson } from "@/lib/client/fetch";
import { useList } from "@/lib/client/hooks";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { liftSchema } from "@/sim/schema";
import { LiftPreview, type PreviewInput } from "./LiftPreview";
import { NumberInput } from "@/components/ui/NumberInput";
import { CheckField, Section } from "@/components/ui/FormSection";
import { getPath, setPath, type Draft, type FieldDef } from "./form-model";
import {
  ARD_FIELDS,
  CHAIN_ROUTING_FIELDS,
  CHAIN_VALUE_FIELDS,
  DRIVE_FIELDS,
  GEOMETRY_FIELDS,
  LIMIT_FIELDS,
  TAKEUP_FIELDS,
} from "./fields";
import { liftFormErrors } from "./schema";
import type { ChainSpecJson, LiftJson } from "./types";

type Mode = { kind: "new" } | { kind: "edit"; lift: LiftJson };

function draftOf(mode: Mode, template: Draft): Draft {
  if (mode.kind === "new") return structuredClone(template);
  const r = mode.lift.currentRevision;
  return structuredClone({
    name: r.name,
    site: r.site ?? "",
    notes: r.notes ?? "",
    chainSpecId: r.chainSpecId,
    lift: r.lift,
    chain: r.chain,
    drive: r.drive,
    takeUp: r.takeUp,
    antiRollback: r.antiRollback,
    limits: r.limits,
  });
}

/** The request body: the chain as the API takes it (catalogue id, or the chain's own values). */
function bodyOf(d: Draft, changeSummary: string): Record<string, unknown> {
  const chain = { ...(d.chain as Record<string, unknown>) };
  const specId = d.chainSpecId as number | null;
  const chainBody = specId
    ? Object.fromEntries([["chainSpecId", specId], ...Object.entries(chain).filter(([k]) => !CHAIN_VALUE_FIELDS.some((f) => f.path === `chain.${k}`))])
    : { ...chain, chainSpecId: null };
  return {
    name: d.name,
    site: d.site || null,
    notes: d.notes || null,
    ...(changeSummary.trim() ? { changeSummary: changeSummary.trim() } : {}),
    lift: d.lift,
    chain: chainBody,
    drive: d.drive,
    takeUp: d.takeUp,
    antiRollback: d.antiRollback,
    limits: d.limits,
  };
}

export function LiftEditor({
  mode,
  template,
  units,
  canWrite,
  onSaved,
}: {
  mode: Mode;
  template: Draft;
  units: UnitSystem;
  canWrite: boolean;
  onSaved?: (lift: LiftJson, message: string) => void;
}) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const [draft, setDraft] = useState<Draft>(() => draftOf(mode, template));
  const [baseVersion, setBaseVersion] = useState(mode.kind === "edit" ? mode.lift.version : 0);
  const [touched, setTouched] = useState<Set<string>>(new Set());
  const [showAll, setShowAll] = useState(false);
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [banner, setBanner] = useState<{ tone: "success" | "error" | "caution"; title: string; text?: string } | null>(null);
  const [conflict, setConflict] = useState<{ current: string | null } | null>(null);
  const [busy, setBusy] = useState(false);
  const [changeSummary, setChangeSummary] = useState("");
  const specs = useList<ChainSpecJson>("/api/chain-specs", { pageSize: 100, sort: "pitch", order: "asc" });

  const errors = useMemo(() => liftFormErrors(draft), [draft]);
  const shown = (path: string) => serverErrors[path] ?? (showAll || touched.has(path) ? errors[path] : undefined);
  const disabled = !canWrite || busy;

  const set = (path: string, v: unknown) => {
    setDraft((d) => setPath(d, path, v));
    setTouched((t) => new Set(t).add(path));
    setServerErrors((e) => {
      if (!(path in e)) return e;
      const n = { ...e };
      delete n[path];
      return n;
    });
  };

  // The preview follows the draft while the geometry is valid, else keeps the last valid drawing.
  const [lastPreview, setLastPreview] = useState<PreviewInput | null>(null);
  const previewInput = useMemo<PreviewInput | null>(() => {
    const g = liftSchema.safeParse(draft.lift);
    if (!g.success) return null;
    const l = g.data;
    if (!(l.chainTo > l.chainFrom)) return null;
    const num = (p: string) => (typeof getPath(draft, p) === "number" && Number.isFinite(getPath(draft, p)) ? (getPath(draft, p) as number) : undefined);
    return {
      lift: l,
      catchSpacing: num("chain.catchSpacing"),
      catchOffset: num("chain.catchOffset"),
      ard: { enabled: getPath(draft, "antiRollback.enabled") !== false, from: num("antiRollback.from") ?? 0, to: num("antiRollback.to") ?? 0 },
      takeUp: { travel: num("takeUp.travel") ?? 1, position: num("takeUp.position") ?? 0 },
      pitch: num("chain.pitch"),
      teeth: num("drive.sprocketTeeth"),
    };
  }, [draft]);
  if (previewInput && previewInput !== lastPreview) setLastPreview(previewInput);

  const field = (def: FieldDef, extraDisabled = false) => (
    <NumberInput
      key={`${def.path}-${units}`}
      def={def}
      units={units}
      value={getPath(draft, def.path)}
      onChange={(v) => set(def.path, v)}
      error={shown(def.path)}
      disabled={disabled || extraDisabled}
    />
  );

  const spec = specs.data?.items.find((s) => s.id === draft.chainSpecId) ?? null;
  const pickSpec = (idText: string) => {
    const id = idText ? Number(idText) : null;
    const s = specs.data?.items.find((x) => x.id === id);
    setDraft((d) => {
      let n = setPath(d, "chainSpecId", id);
      if (s) for (const k of ["pitch", "massPerLength", "axialStiffness", "breakingStrength"] as const) n = setPath(n, `chain.${k}`, s[k]);
      return n;
    });
  };

  async function save() {
    setBanner(null);
    setConflict(null);
    if (Object.keys(errors).length) {
      setShowAll(true);
      setBanner({ tone: "error", title: "Some fields need attention", text: `${Object.keys(errors).length} field(s) are not valid; each says why beside it. Nothing was saved.` });
      return;
    }
    setBusy(true);
    try {
      if (mode.kind === "new") {
        const created = await sendJson<LiftJson>("/api/lifts", "POST", bodyOf(draft, changeSummary));
        router.push(`/lifts/${created.id}?saved=1`);
        return;
      }
      const res = await sendJson<LiftJson & { changes: unknown[] }>(`/api/lifts/${mode.lift.id}`, "PATCH", {
        version: baseVersion,
        ...bodyOf(draft, changeSummary),
      });
      setBaseVersion(res.version);
      setTouched(new Set());
      setShowAll(false);
      setChangeSummary("");
      const msg = res.changes.length
        ? `Saved as revision ${res.currentRevision.number} (${res.changes.length} field${res.changes.length === 1 ? "" : "s"} changed).`
        : "Nothing changed, so no new revision was written.";
      setBanner({ tone: "success", title: msg });
      onSaved?.(res, msg);
      const prefix = `/api/lifts/${mode.lift.id}`;
      void mutate((key) => typeof key === "string" && key.startsWith(prefix));
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError) {
        if (err.status === 409) {
          setConflict({ current: err.headers?.get("X-Current-Version") ?? null });
        } else if (err.status === 400) {
          setServerErrors(issueMap(err.issues));
          setShowAll(true);
          setBanner({ tone: "error", title: "The server did not accept the lift", text: err.message });
        } else setBanner({ tone: "error", title: err.message });
      } else setBanner({ tone: "error", title: "Saving failed", text: String(err) });
    } finally {
      setBusy(false);
    }
  }

  async function reloadLatest() {
    if (mode.kind !== "edit") return;
    const res = await fetch(`/api/lifts/${mode.lift.id}`);
    if (!res.ok) return;
    const latest = (await res.json()) as LiftJson;
    setDraft(draftOf({ kind: "edit", lift: latest }, template));
    setBaseVersion(latest.version);
    setConflict(null);
    setTouched(new Set());
    setServerErrors({});
    setBanner({ tone: "caution", title: `Loaded version ${latest.version} (revision ${latest.currentRevision.number}). Apply your change again.` });
    router.refresh();
  }

  const errorCount = Object.keys(errors).length;
  return (
    <div className="grid gap-5 xl:grid-cols-[minmax(0,1fr)_400px]">
      <form
        className="space-y-4"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          void save();
        }}
        data-testid="lift-form"
      >
        {!canWrite && (
          <Alert tone="info" testId="read-only-note" title="Read only">
            Your role may read this lift but not change it.
          </Alert>
        )}
        {conflict && (
          <Alert tone="caution" testId="conflict-banner" title="Someone else saved this lift while you were editing">
            <p>
              The lift is now at version {conflict.current ?? "a newer one"}; you edited version {baseVersion}. Nothing was saved. Your edits are still in the form;
              load the latest version to see the other change, then apply yours again.
            </p>
            <Button type="button" size="sm" variant="secondary" className="mt-2" onClick={() => void reloadLatest()} data-testid="reload-latest">
              Load the latest version
            </Button>
          </Alert>
        )}
        {banner && (
          <Alert tone={banner.tone} testId="save-banner" title={banner.title}>
            {banner.text}
          </Alert>
        )}
        <fieldset className="grid gap-3 rounded-lg border border-steel-300/70 bg-white px-4 py-3.5 sm:grid-cols-2">
          <legend className="sr-only">Lift</legend>
          <div>
            <label htmlFor="f-name" className="mb-1 block text-[12.5px] font-semibold text-ink-800">
              Name
            </label>
            <Input id="f-name" name="name" className="h-9" value={String(draft.name ?? "")} disabled={disabled} invalid={!!shown("name")} onChange={(e) => set("name", e.target.value)} />
            {shown("name") && (
              <p data-testid="error-name" className="mt-1 text-[12px] font-medium text-fail">
                {shown("name")}
              </p>
            )}
          </div>
          <div>
            <label htmlFor="f-site" className="mb-1 block text-[12.5px] font-semibold text-ink-800">
              Site
            </label>
            <Input id="f-site" name="site" className="h-9" value={String(draft.site ?? "")} disabled={disabled} onChange={(e) => set("site", e.target.value)} />
          </div>
        </fieldset>

        <Section title="Lift hill geometry" description="Track positions are measured along the track from its start.">
          {GEOMETRY_FIELDS.map((f) => field(f))}
        </Section>

        <Section title="Chain" description="Pick a catalogue chain, or type the chain's own values.">
          <div className="col-span-2 sm:col-span-3">
            <label htmlFor="f-chainSpecId" className="mb-1 block text-[12.5px] font-semibold text-ink-800">
              Chain size
            </label>
            <Select id="f-chainSpecId" name="chainSpecId" className="h-9" value={draft.chainSpecId ? String(draft.chainSpecId) : ""} disabled={disabled} onChange={(e) => pickSpec(e.target.value)} data-testid="chain-spec-select">
              <option value="">Typed in (not from the catalogue)</option>
              {specs.data?.items.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.designation} · pitch {formatQuantity(s.pitch, "smallLength", units)} · breaking {formatQuantity(s.breakingStrength, "force", units)}
                  {s.standard ? "" : " · own"}
                </option>
              ))}
            </Select>
            {shown("chain.chainSpecId") && <p className="mt-1 text-[12px] font-medium text-fail">{shown("chain.chainSpecId")}</p>}
            {spec && <p className="mt-1 text-[11.5px] text-steel-500">Source: {spec.source}</p>}
          </div>
          {CHAIN_VALUE_FIELDS.map((f) => field(f, !!draft.chainSpecId))}
          {CHAIN_ROUTING_FIELDS.map((f) => field(f))}
        </Section>

        <Section title="Drive">{DRIVE_FIELDS.map((f) => field(f))}</Section>
        <Section title="Take-up" description="Weighted 2:1 gravity take-up on the bottom run.">
          {TAKEUP_FIELDS.map((f) => field(f))}
        </Section>
        <Section title="Anti-rollback device (ARD)">
          <CheckField path="antiRollback.enabled" label="ARD fitted" value={getPath(draft, "antiRollback.enabled") !== false} disabled={disabled} onChange={(v) => set("antiRollback.enabled", v)} />
          {ARD_FIELDS.map((f) => field(f))}
        </Section>
        <Section title="Check limits" description="Defaults name their source or say they are an assumption; change them for this lift.">
          {LIMIT_FIELDS.map((f) => field(f))}
          <CheckField
            path="limits.allowRollback"
            label="Allow settling back onto the ARD"
            value={getPath(draft, "limits.allowRollback") === true}
            disabled={disabled}
            onChange={(v) => set("limits.allowRollback", v)}
          />
        </Section>

        {canWrite && (
          <div className="sticky bottom-0 z-10 flex flex-wrap items-center gap-3 rounded-lg border border-steel-300/70 bg-paper/95 px-4 py-3 backdrop-blur">
            <Input
              aria-label="What changed (shown in the revision history)"
              placeholder="What changed and why (optional)"
              className="h-9 max-w-md flex-1"
              value={changeSummary}
              onChange={(e) => setChangeSummary(e.target.value)}
              name="changeSummary"
            />
            <Button type="submit" busy={busy} data-testid="save-lift">
              {mode.kind === "new" ? "Create lift" : "Save as new revision"}
            </Button>
            <span className="text-[12.5px] text-steel-500" data-testid="form-status">
              {errorCount ? `${errorCount} field(s) to fix` : "All fields valid"}
              {mode.kind === "edit" ? ` · editing version ${baseVersion}` : ""}
            </span>
          </div>
        )}
      </form>
      <div className="space-y-4 xl:sticky xl:top-20 xl:self-start">
        <LiftPreview input={previewInput ?? lastPreview} units={units} stale={!previewInput} />
        {!previewInput && lastPreview && <p className="text-[12px] text-steel-500">The geometry fields have a problem; the drawing shows the last valid geometry.</p>}
      </div>
    </div>
  );
}
