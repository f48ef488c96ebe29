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
import { Input } from "@/components/ui/Field";
import { useSchemaForm } from "@/components/ui/useSchemaForm";
import { ApiError, sendJson } from "@/lib/client/fetch";
import type { UnitSystem } from "@/lib/client/units";
import { liftRevisionSchema } from "@/lib/lifts/schema";
import { crossFieldIssues } from "@/sim/schema";
import { bodyOf, draftOf, type Mode } from "./draft";
import { LIFT_FORM_LABELS, profileLabels } from "./fields";
import type { Draft } from "@/components/ui/form-draft";
import { LiftFormSections } from "./LiftFormSections";
import { LiftPreview } from "./LiftPreview";
import type { LiftJson } from "./types";
import { useLiftPreview } from "./useLiftPreview";

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
  const [pieceCount, setPieceCount] = useState(() => 30 + (mode.kind === "edit" && Array.isArray(mode.lift.currentRevision.lift.profile) ? mode.lift.currentRevision.lift.profile.length : 0));
  // Labels for the pieces of lift.profile, so their messages name "Piece 3 slope" rather than a path.
  const fields = useMemo(() => [...LIFT_FORM_LABELS, ...profileLabels(pieceCount)], [pieceCount]);
  const form = useSchemaForm({ schema: liftRevisionSchema, initial: () => draftOf(mode, template), fields, units, also: crossFieldIssues });
  const { draft, setDraft, set, shown, errors, busy } = form;
  const profile = (draft.lift as { profile?: unknown } | undefined)?.profile;
  const count = Array.isArray(profile) ? profile.length : 0;
  if (count > pieceCount) setPieceCount(count + 30); // labels a little ahead of the pieces added
  const [baseVersion, setBaseVersion] = useState(mode.kind === "edit" ? mode.lift.version : 0);
  const [banner, setBanner] = useState<{ tone: "success" | "error" | "caution"; title: string; text?: string } | null>(null);
  const [conflict, setConflict] = useState<{ current: string | null } | null>(null);
  const [changeSummary, setChangeSummary] = useState("");
  const disabled = !canWrite || busy;

  const { previewInput, lastPreview } = useLiftPreview(draft);

  async function save() {
    setBanner(null);
    setConflict(null);
    try {
      const outcome = await form.submit(async () => {
        if (mode.kind === "new") {
          const created = await sendJson<LiftJson>("/api/lifts", "POST", bodyOf(draft, changeSummary));
          router.push(`/lifts/${created.id}?saved=1`);
          return "leaving";
        }
        const res = await sendJson<LiftJson & { changes: unknown[] }>(`/api/lifts/${mode.lift.id}`, "PATCH", {
          version: baseVersion,
          ...bodyOf(draft, changeSummary),
        });
        setBaseVersion(res.version);
        form.settle();
        setChangeSummary("");
        const msg = res.changes.length
          ? `Saved as revision ${res.currentRevision.number} (${res.changes.length} field${res.changes.length === 1 ? "" : "s"} changed).`
          : "Nothing changed, so no new revision was written.";
        setBanner({ tone: "success", title: msg });
        onSaved?.(res, msg);
        const prefix = `/api/lifts/${mode.lift.id}`;
        void mutate((key) => typeof key === "string" && key.startsWith(prefix));
        router.refresh();
      });
      if (outcome === "invalid")
        setBanner({ tone: "error", title: "Some fields need attention", text: `${Object.keys(errors).length} field(s) are not valid; each says why beside it. Nothing was saved.` });
      if (outcome === "rejected") setBanner({ tone: "error", title: "The server did not accept the lift", text: "Each field says why beside it. Nothing was saved." });
    } catch (err) {
      if (err instanceof ApiError && err.status === 409) setConflict({ current: err.headers?.get("X-Current-Version") ?? null });
      else if (err instanceof ApiError) setBanner({ tone: "error", title: err.message });
      else setBanner({ tone: "error", title: "Saving failed", text: String(err) });
    }
  }

  async function reloadLatest() {
    if (mode.kind !== "edit") return;
    const res = await fetch(`/api/lifts/${mode.lift.id}`);
    if (!res.ok) return;
    const latest = (await res.json()) as LiftJson;
    setDraft(() => draftOf({ kind: "edit", lift: latest }, template));
    setBaseVersion(latest.version);
    setConflict(null);
    form.settle();
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

        <LiftFormSections form={form} units={units} disabled={disabled} />

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
