"use client";
/**
 * The scenario editor's "Trains on the lift": the lead train (the scenario's own train and entry fields) and
 * the following trains (train, loading, start time, entry speed, start position), with a timeline strip over
 * the run showing when each train appears, the stop and the restart. Everything is edited through the fields;
 * the strip only shows them.
 */
import { Button } from "@/components/ui/Button";
import { Select } from "@/components/ui/Field";
import { NumberInput, fieldId } from "@/components/ui/NumberInput";
import { Section } from "@/components/ui/FormSection";
import { getPath, type Draft, type FieldDef } from "@/components/ui/form-draft";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { MAX_FOLLOWERS, type ScenarioFollowerInput } from "@/lib/scenarios/followers";
import { LOADINGS } from "@/lib/scenarios/loading";
import { LOADING_LABELS } from "./types";
import { labelledError } from "./DynamicsSection";

/** The fields of following train i (path followers.i.…), labelled with the train's number on the lift. */
export function followerFields(i: number): FieldDef[] {
  const n = i + 2;
  return [
    { path: `followers.${i}.startTime`, label: `Train ${n} appears at`, q: "time", hint: "s from the start of the run" },
    { path: `followers.${i}.entrySpeed`, label: `Train ${n} entry speed`, q: "speed" },
    { path: `followers.${i}.startPosition`, label: `Train ${n} start position (front)`, q: "length", hint: "Trains that appear at the same time must not overlap" },
    { path: `followers.${i}.riderCount`, label: `Train ${n} riders`, q: "count", int: true },
  ];
}

/** Labels of the non-number fields of following train i, for messages in words. */
export function followerLabels(i: number) {
  const n = i + 2;
  return [
    ...followerFields(i),
    { path: `followers.${i}.trainId`, label: `Train ${n}` },
    { path: `followers.${i}.loading`, label: `Train ${n} loading` },
    { path: `followers.${i}`, label: `Train ${n}` },
  ];
}

interface Props {
  draft: Draft;
  set: (path: string, value: unknown) => void;
  shown: (path: string) => string | undefined;
  units: UnitSystem;
  disabled: boolean;
  trains: { id: number; name: string }[];
}

export function TrainsSection({ draft, set, shown, units, disabled, trains }: Props) {
  const followers = (Array.isArray(draft.followers) ? draft.followers : []) as Partial<ScenarioFollowerInput>[];
  const setList = (list: Partial<ScenarioFollowerInput>[]) => set("followers", list);
  const add = () => {
    // A new train appears where the last one did, one chain's worth of seconds later (edit both as needed).
    const last = followers[followers.length - 1];
    const t0 = typeof last?.startTime === "number" ? last.startTime : typeof draft.startTime === "number" ? draft.startTime : 0;
    setList([
      ...followers,
      {
        trainId: (last?.trainId ?? draft.trainId) as number | undefined,
        loading: (last?.loading ?? draft.loading ?? "full") as ScenarioFollowerInput["loading"],
        entrySpeed: (last?.entrySpeed ?? draft.entrySpeed) as number | undefined,
        startPosition: (last?.startPosition ?? draft.startPosition) as number | undefined,
        startTime: t0 + 12,
      },
    ]);
  };
  const remove = (i: number) => setList(followers.filter((_, k) => k !== i));
  const err = (p: string) => shown(p);
  return (
    <Section
      title="Trains on the lift"
      description="The train above is train 1 (the lead train). Add the trains dispatched after it onto the same lift: each appears at its start position with its entry speed at its start time. Trains that appear at the same time must not overlap."
    >
      <div className="col-span-2 sm:col-span-3" data-testid="trains-on-lift">
        <LiftTimeline draft={draft} units={units} />
        {followers.length === 0 && <p className="mt-2 text-[12.5px] text-steel-500">Only the lead train on the lift.</p>}
        <ol className="mt-3 space-y-3">
          {followers.map((f, i) => {
            const n = i + 2;
            const [startTime, entrySpeed, startPosition, riderCount] = followerFields(i);
            const trainPath = `followers.${i}.trainId`;
            const loadingPath = `followers.${i}.loading`;
            return (
              <li key={i} className="rounded-md border border-steel-300/70 bg-steel-50/40 px-3 py-2.5" data-testid={`follower-${i}`}>
                <div className="mb-2 flex items-center justify-between">
                  <h4 className="text-[13px] font-bold text-ink-900">Train {n}</h4>
                  <Button type="button" size="sm" variant="secondary" disabled={disabled} onClick={() => remove(i)} data-testid={`remove-follower-${i}`}>
                    Remove train {n}
                  </Button>
                </div>
                {err(`followers.${i}`) && <p className="mb-1 text-[12px] font-medium text-fail">{err(`followers.${i}`)}</p>}
                <div className="grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
                  <div>
                    <label htmlFor={fieldId(trainPath)} className="mb-1 block text-[12.5px] font-semibold text-ink-800">Train {n}</label>
                    <Select id={fieldId(trainPath)} className="h-9" value={f.trainId ? String(f.trainId) : ""} disabled={disabled} onChange={(e) => set(trainPath, e.target.value ? Number(e.target.value) : undefined)}>
                      <option value="">Choose a train</option>
                      {trains.map((t) => <option key={t.id} value={t.id}>{t.name}</option>)}
                    </Select>
                    {err(trainPath) && <p data-testid={`error-${trainPath}`} className="mt-1 text-[12px] font-medium text-fail">{err(trainPath)}</p>}
                  </div>
                  <div>
                    <label htmlFor={fieldId(loadingPath)} className="mb-1 block text-[12.5px] font-semibold text-ink-800">Train {n} loading</label>
                    <Select
                      id={fieldId(loadingPath)}
                      className="h-9"
                      value={String(f.loading ?? "full")}
                      disabled={disabled}
                      onChange={(e) => {
                        set(loadingPath, e.target.value);
                        if (e.target.value !== "riders") set(`followers.${i}.riderCount`, undefined);
                      }}
                    >
                      {LOADINGS.map((l) => <option key={l} value={l}>{LOADING_LABELS[l]}</option>)}
                    </Select>
                    {err(loadingPath) && <p className="mt-1 text-[12px] font-medium text-fail">{err(loadingPath)}</p>}
                  </div>
                  {f.loading === "riders" && (
                    <NumberInput def={riderCount!} units={units} value={f.riderCount} onChange={(v) => set(riderCount!.path, v)} error={err(riderCount!.path)} disabled={disabled} />
                  )}
                  {[startTime!, entrySpeed!, startPosition!].map((def) => (
                    <NumberInput
                      key={`${def.path}-${units}`}
                      def={def}
                      units={units}
                      value={getPath(draft, def.path)}
                      onChange={(v) => set(def.path, v)}
                      error={labelledError(def, units, err(def.path))}
                      disabled={disabled}
                    />
                  ))}
                </div>
              </li>
            );
          })}
        </ol>
        {err("followers") && <p className="mt-1 text-[12px] font-medium text-fail">{err("followers")}</p>}
        <div className="mt-3">
          <Button type="button" size="sm" variant="secondary" disabled={disabled || followers.length >= MAX_FOLLOWERS} onClick={add} data-testid="add-follower">
            Add a following train
          </Button>
        </div>
      </div>
    </Section>
  );
}

/**
 * A strip over the run's duration: a mark where each train appears, the stop (with its kind and duration) and
 * the restart. It follows the fields as they are edited.
 */
export function LiftTimeline({ draft, units }: { draft: Draft; units: UnitSystem }) {
  const duration = Number(getPath(draft, "runSettings.duration")) || 40;
  const followers = (Array.isArray(draft.followers) ? draft.followers : []) as Partial<ScenarioFollowerInput>[];
  const starts = [Number(draft.startTime) || 0, ...followers.map((f) => Number(f.startTime) || 0)];
  const stop = getPath(draft, "dynamics.drive.stop") as { kind?: string; time?: number; duration?: number } | undefined;
  const restart = getPath(draft, "dynamics.drive.restart.time") as number | undefined;
  const x = (t: number) => `${Math.min(100, Math.max(0, (t / duration) * 100))}%`;
  const s = (t: number) => formatQuantity(t, "time", units, 1);
  const stopText =
    stop?.kind && typeof stop.time === "number"
      ? `stop at ${s(stop.time)}, ${stop.kind === "brake" ? "brake" : "power loss"}${typeof stop.duration === "number" ? ` in ${s(stop.duration)}` : ""}`
      : null;
  const restartText = typeof restart === "number" ? `restart at ${s(restart)}` : null;
  return (
    <figure className="rounded-md border border-steel-300/70 bg-white px-3 pb-2 pt-3" data-testid="lift-timeline" aria-label="Timeline of the run">
      <div className="relative h-14">
        <div className="absolute inset-x-0 top-6 h-[3px] rounded bg-steel-300" />
        {stop?.kind && typeof stop.time === "number" && (
          <div
            className="absolute top-4 h-[7px] rounded bg-fail/25"
            style={{ left: x(stop.time), width: `calc(${x(typeof restart === "number" ? restart : duration)} - ${x(stop.time)})` }}
            aria-hidden
          />
        )}
        {starts.map((t, i) => (
          <div key={i} className="absolute top-0 -translate-x-1/2 text-center" style={{ left: x(t) }} data-testid={`timeline-train-${i + 1}`}>
            <span className="inline-flex size-5 items-center justify-center rounded-full bg-ink-900 font-mono text-[10.5px] font-bold text-white">{i + 1}</span>
            <span className="block h-3 w-px translate-x-2.5 bg-ink-900" />
          </div>
        ))}
        {stopText && (
          <div className="absolute top-7 -translate-x-1/2 whitespace-nowrap text-[11px] font-semibold text-fail" style={{ left: x(stop!.time!) }} data-testid="timeline-stop">
            ▲ {stopText}
          </div>
        )}
        {restartText && (
          <div className="absolute top-7 -translate-x-1/2 whitespace-nowrap text-[11px] font-semibold text-pass" style={{ left: x(restart!) }} data-testid="timeline-restart">
            ▲ {restartText}
          </div>
        )}
      </div>
      <figcaption className="mt-1 flex justify-between font-mono text-[10.5px] text-steel-500">
        <span>{s(0)}</span>
        <span>
          {starts.map((t, i) => `train ${i + 1} at ${s(t)}`).join(" · ")}
          {stopText ? ` · ${stopText}` : ""}
          {restartText ? ` · ${restartText}` : ""}
        </span>
        <span>{s(duration)}</span>
      </figcaption>
    </figure>
  );
}
