"use client";
/**
 * The lift's track: "Parametric" (approach, sag, incline, crest, exit fields) or "Pieces" (`lift.profile`: a
 * table of straights and arcs with add, remove and reorder), and an import of survey points from CSV that fits
 * pieces (sim/profile-fit.ts) and shows them with the residual before they are applied.
 */
import { useMemo, useRef, useState } from "react";
import { Button } from "@/components/ui/Button";
import { Select } from "@/components/ui/Field";
import { NumberInput } from "@/components/ui/NumberInput";
import { Section } from "@/components/ui/FormSection";
import type { SchemaForm } from "@/components/ui/useSchemaForm";
import { formatQuantity, unitOf, type UnitSystem } from "@/lib/client/units";
import { getPath } from "@/components/ui/form-draft";
import { readSurveyCsv } from "@/lib/lifts/survey-csv";
import { parametricProfile, PARAMETRIC_FIELDS, type ProfilePiece } from "@/sim/profile";
import { parametricOfProfile } from "@/sim/track";
import { fitProfile, type SurveyPoint } from "@/sim/profile-fit";
import { profileFieldDefs } from "./fields";

type Piece = Record<string, unknown>;

export function ProfileSection({
  form,
  units,
  disabled,
  parametric,
  extent,
}: {
  form: SchemaForm;
  units: UnitSystem;
  disabled: boolean;
  /** The parametric fields (shown while no pieces are given) and the chain extent fields (always). */
  parametric: React.ReactNode;
  extent: React.ReactNode;
}) {
  const { draft, set, errors } = form;
  // Messages of the pieces show once the section has been edited (the form marks only "lift.profile" touched).
  const [edited, setEdited] = useState(false);
  const shown = (path: string) => form.shown(path) ?? (edited ? errors[path] : undefined);
  const raw = getPath(draft, "lift.profile");
  const pieces: Piece[] | null = Array.isArray(raw) ? (raw as Piece[]) : null;
  const [survey, setSurvey] = useState<{ points: SurveyPoint[]; file: string } | null>(null);
  const [tolerance, setTolerance] = useState<number | undefined>(0.1); // m, Douglas–Peucker tolerance of the fit
  const [importError, setImportError] = useState<string | null>(null);
  const toleranceOk = typeof tolerance === "number" && Number.isFinite(tolerance) && tolerance > 0;
  // The fit of the loaded points, again whenever the tolerance changes.
  const fitted = useMemo(() => {
    if (!survey || !toleranceOk) return null;
    try {
      return { fit: fitProfile(survey.points, { tolerance }), file: survey.file, error: null };
    } catch (err) {
      return { fit: null, file: survey.file, error: err instanceof Error ? err.message : String(err) };
    }
  }, [survey, tolerance, toleranceOk]);
  const fit = fitted?.fit ? { fit: fitted.fit, file: fitted.file } : null;
  const fileRef = useRef<HTMLInputElement>(null);

  const setPieces = (next: Piece[] | null) => {
    setEdited(true);
    set("lift.profile", next);
  };
  const choose = (mode: string) => {
    if (mode === "parametric") {
      // Empty parametric fields start from the profile's nearest parametric shape (a starting point to edit).
      const l = (draft.lift ?? {}) as Record<string, unknown>;
      if (pieces && PARAMETRIC_FIELDS.some((k) => typeof l[k] !== "number")) {
        try {
          const near = parametricOfProfile(pieces as ProfilePiece[]);
          for (const k of PARAMETRIC_FIELDS) if (typeof l[k] !== "number") set(`lift.${k}`, near[k]);
        } catch {
          // Pieces that do not make a track leave the fields empty: the form names them.
        }
      }
      return setPieces(null);
    }
    if (pieces) return;
    // Start from the parametric lift's five pieces when its fields are all numbers, else one level straight.
    const l = (draft.lift ?? {}) as Record<string, unknown>;
    const complete = PARAMETRIC_FIELDS.every((k) => typeof l[k] === "number" && Number.isFinite(l[k]));
    setPieces(complete ? parametricProfile(l as Record<(typeof PARAMETRIC_FIELDS)[number], number>) : [{ kind: "straight", length: 20, angle: 0 }]);
  };
  // A piece keeps only the fields given a value (an arc has no length, a straight no radius).
  const update = (i: number, patch: Piece) =>
    pieces && setPieces(pieces.map((p, k) => (k === i ? Object.fromEntries(Object.entries({ ...p, ...patch }).filter(([, v]) => v !== undefined)) : p)));
  const changeKind = (i: number, kind: string) => {
    if (!pieces) return;
    const p = pieces[i];
    const angle = (p.kind === "arc" ? p.toAngle : p.angle) as number | undefined;
    update(i, kind === "arc" ? { kind, radius: 30, toAngle: angle, length: undefined, angle: undefined } : { kind, length: 20, angle, radius: undefined, toAngle: undefined });
  };
  const move = (i: number, d: -1 | 1) => {
    if (!pieces || i + d < 0 || i + d >= pieces.length) return;
    const next = [...pieces];
    [next[i], next[i + d]] = [next[i + d], next[i]];
    setPieces(next);
  };
  /** The slope where the last piece ends (a new straight continues it), degrees. */
  const endAngle = () => {
    const last = pieces?.[pieces.length - 1];
    const a = last ? (last.kind === "arc" ? last.toAngle : last.angle) : 0;
    return typeof a === "number" ? a : 0;
  };

  async function importCsv(file: File) {
    setImportError(null);
    setSurvey(null);
    const read = readSurveyCsv(await file.text(), units);
    if (read.issues.length) return setImportError(read.issues.join("; "));
    setSurvey({ points: read.points, file: file.name });
  }

  const len = (v: number, digits?: number) => formatQuantity(v, "length", units, digits);
  return (
    <Section title="Lift hill geometry" description="Track positions are measured along the track from its start (the station, level).">
      <div className="col-span-2 sm:col-span-3">
        <label htmlFor="f-lift-profile-mode" className="mb-1 block text-[12.5px] font-semibold text-ink-800">
          Profile
        </label>
        <Select id="f-lift-profile-mode" name="profileMode" className="h-9 max-w-xs" value={pieces ? "pieces" : "parametric"} disabled={disabled} onChange={(e) => choose(e.target.value)} data-testid="profile-mode">
          <option value="parametric">Parametric (approach, sag, incline, crest, exit)</option>
          <option value="pieces">Pieces (straights and arcs)</option>
        </Select>
      </div>
      {!pieces && parametric}
      {pieces && (
        <div className="col-span-2 space-y-2 sm:col-span-3" data-testid="profile-pieces">
          <p className="text-[12px] text-steel-500">
            From the level station: a straight keeps its slope; an arc turns the slope to its end angle (up: a sag, down: a crest). A straight must start at the slope the piece before ends at.
          </p>
          {pieces.map((p, i) => {
            const defs = profileFieldDefs(i, p.kind === "arc" ? "arc" : "straight");
            return (
              <div key={i} className="grid grid-cols-[8.5rem_1fr_1fr_auto] items-start gap-2" data-testid={`profile-piece-${i}`}>
                <div>
                  <label htmlFor={`f-lift-profile-${i}-kind`} className="mb-1 block text-[12.5px] font-semibold text-ink-800">
                    Piece {i + 1}
                  </label>
                  <Select id={`f-lift-profile-${i}-kind`} className="h-9" value={p.kind === "arc" ? "arc" : "straight"} disabled={disabled} onChange={(e) => changeKind(i, e.target.value)}>
                    <option value="straight">Straight</option>
                    <option value="arc">Arc</option>
                  </Select>
                  {shown(`lift.profile.${i}.kind`) && <p className="mt-1 text-[12px] font-medium text-fail">{shown(`lift.profile.${i}.kind`)}</p>}
                </div>
                {defs.map((def) => (
                  <NumberInput
                    key={`${def.path}-${p.kind}-${units}`}
                    def={def}
                    units={units}
                    value={p[def.path.split(".").pop()!]}
                    onChange={(v) => update(i, { [def.path.split(".").pop()!]: v })}
                    error={shown(def.path)}
                    disabled={disabled}
                  />
                ))}
                <div className="flex gap-1 pt-5">
                  <Button type="button" size="sm" variant="ghost" aria-label={`Move piece ${i + 1} up`} disabled={disabled || i === 0} onClick={() => move(i, -1)}>
                    ↑
                  </Button>
                  <Button type="button" size="sm" variant="ghost" aria-label={`Move piece ${i + 1} down`} disabled={disabled || i === pieces.length - 1} onClick={() => move(i, 1)}>
                    ↓
                  </Button>
                  <Button type="button" size="sm" variant="ghost" aria-label={`Remove piece ${i + 1}`} disabled={disabled} onClick={() => setPieces(pieces.filter((_, k) => k !== i))}>
                    ×
                  </Button>
                </div>
              </div>
            );
          })}
          {shown("lift.profile") && (
            <p className="text-[12px] font-medium text-fail" data-testid="error-lift-profile">
              {shown("lift.profile")}
            </p>
          )}
          <div className="flex flex-wrap gap-2">
            <Button type="button" size="sm" variant="secondary" disabled={disabled} onClick={() => setPieces([...pieces, { kind: "straight", length: 10, angle: endAngle() }])} data-testid="add-straight">
              Add straight
            </Button>
            <Button type="button" size="sm" variant="secondary" disabled={disabled} onClick={() => setPieces([...pieces, { kind: "arc", radius: 30, toAngle: endAngle() > 0 ? 0 : 30 }])} data-testid="add-arc">
              Add arc
            </Button>
          </div>
        </div>
      )}
      {extent}
      <div className="col-span-2 space-y-2 sm:col-span-3">
        <input
          ref={fileRef}
          type="file"
          accept=".csv,text/csv,text/plain"
          className="sr-only"
          aria-label="Survey points CSV file"
          data-testid="survey-file"
          onChange={(e) => {
            const f = e.target.files?.[0];
            if (f) void importCsv(f);
            e.target.value = "";
          }}
        />
        <Button type="button" size="sm" variant="secondary" disabled={disabled} onClick={() => fileRef.current?.click()} data-testid="import-survey">
          Import survey points (CSV)
        </Button>
        <p className="text-[11.5px] text-steel-500">Two columns: horizontal distance and height ({unitOf("length", units).label}), from the station, an optional header row.</p>
        {(importError ?? fitted?.error) && (
          <p className="text-[12px] font-medium text-fail" data-testid="survey-error">
            {importError ?? fitted?.error}
          </p>
        )}
        {survey && (
          <div className="max-w-[14rem]">
            <NumberInput
              key={`survey-tolerance-${units}`}
              def={{ path: "survey.tolerance", label: "Fit tolerance", q: "smallLength", hint: "Deviations below it start no new straight" }}
              units={units}
              value={tolerance}
              onChange={setTolerance}
              error={toleranceOk ? undefined : "Fit tolerance must be a number greater than 0"}
              disabled={disabled}
            />
          </div>
        )}
        {fit && (
          <div className="rounded-md border border-steel-300/70 bg-paper px-3 py-2 text-[12.5px]" data-testid="survey-fit">
            <p className="font-semibold text-ink-900">
              {fit.file}: {fit.fit.points} points → {fit.fit.pieces.length} pieces; residual RMS {len(fit.fit.rms, 3)}, largest {len(fit.fit.max, 3)}
            </p>
            <ol className="mt-1 max-h-40 list-decimal overflow-auto pl-5 font-mono text-[12px] text-steel-700">
              {fit.fit.pieces.map((p: ProfilePiece, i) => (
                <li key={i}>{p.kind === "straight" ? `straight ${len(p.length)} at ${p.angle}°` : `arc radius ${len(p.radius)} to ${p.toAngle}°`}</li>
              ))}
            </ol>
            <p className="mt-1 text-[11.5px] text-steel-500">Check the fitted profile against the survey; results support, never replace, review by a qualified engineer.</p>
            <div className="mt-2 flex gap-2">
              <Button
                type="button"
                size="sm"
                disabled={disabled}
                onClick={() => {
                  setPieces(fit.fit.pieces);
                  setSurvey(null);
                }}
                data-testid="apply-fit"
              >
                Use these pieces
              </Button>
              <Button type="button" size="sm" variant="ghost" onClick={() => setSurvey(null)}>
                Discard
              </Button>
            </div>
          </div>
        )}
      </div>
    </Section>
  );
}
