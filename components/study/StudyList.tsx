"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import useSWR from "swr";
import { fromDisplay, unitOf, type UnitSystem } from "@/lib/client/units";
import { PARAMETER_LABELS, STUDY_LOADINGS, STUDY_PARAMETER_KEYS, type StudyParameterKey } from "@/lib/studies/schema";
import type { StudyView } from "@/lib/studies/service";
import type { StudyListLine } from "@/lib/studies/events";
import { Badge } from "@/components/ui/Badge";
import { Button } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { getJson } from "@/lib/client/fetch";
import { useJobEvents } from "@/lib/client/job-events";
import { useSubmitOnce } from "@/components/ui/useSubmitOnce";
import { parseNumber } from "@/lib/units/parse-number";

interface ParamDraft {
  key: StudyParameterKey | "";
  from: string;
  to: string;
  step: string;
  list: string;
}

const empty: ParamDraft = { key: "", from: "", to: "", step: "", list: "" };

/** A typed value (2,5 or 2.5) in SI; NaN when it is not a number, so the server's schema names the field. */
function toSi(key: StudyParameterKey, v: string, units: UnitSystem): number {
  const q = PARAMETER_LABELS[key].quantity;
  const r = parseNumber(v);
  const n = r.ok ? r.value : Number.NaN;
  return q ? fromDisplay(n, q, units) : n;
}

/** A list of values: separated by ";" or by a comma followed by a space, so "2,5; 3" keeps its decimal comma. */
const listItems = (text: string) => text.split(/;|,\s+|\s+/).map((s) => s.trim()).filter(Boolean);

/** "parameters.0.range.to" → "Parameter 1, to:" (the user never sees a dotted path). */
function placeOf(path: string): string {
  const m = /^parameters\.(\d+)(?:\.(range\.)?(\w+))?/.exec(path);
  if (m) return `Parameter ${Number(m[1]) + 1}${m[3] ? `, ${m[3] === "values" ? "list" : m[3]}` : ""}:`;
  const names: Record<string, string> = { scenarioId: "Scenario:", name: "Study name:", "settings.segments": "Segments:", "settings.duration": "Duration:", parameters: "Parameters:" };
  return names[path] ?? "";
}

function buildParam(p: ParamDraft, units: UnitSystem): Record<string, unknown> | null {
  if (!p.key) return null;
  if (p.key === "loading") return { key: "loading", values: p.list.split(",").map((s) => s.trim()).filter(Boolean) };
  if (p.key === "chainSpec") return { key: "chainSpec", values: p.list.split(/[,;\s]+/).filter(Boolean).map(Number) };
  if (p.list.trim()) return { key: p.key, values: listItems(p.list).map((s) => toSi(p.key as StudyParameterKey, s, units)) };
  return { key: p.key, range: { from: toSi(p.key, p.from, units), to: toSi(p.key, p.to, units), step: toSi(p.key, p.step, units) } };
}

function ParamFields({ n, p, set, units }: { n: number; p: ParamDraft; set: (p: ParamDraft) => void; units: UnitSystem }) {
  const q = p.key ? PARAMETER_LABELS[p.key].quantity : null;
  const unit = q ? unitOf(q, units).label : "";
  const listOnly = p.key === "loading" || p.key === "chainSpec";
  return (
    <fieldset className="grid gap-2 rounded border border-steel-200 p-3 text-sm md:grid-cols-5">
      <legend className="px-1 text-steel-600">Parameter {n}{n === 2 ? " (optional)" : ""}</legend>
      <select aria-label={`parameter ${n}`} className="h-9 rounded border border-steel-300 px-2" value={p.key} onChange={(e) => set({ ...p, key: e.target.value as StudyParameterKey })}>
        <option value="">{n === 1 ? "Choose…" : "None"}</option>
        {STUDY_PARAMETER_KEYS.map((k) => (
          <option key={k} value={k}>
            {PARAMETER_LABELS[k].label}
          </option>
        ))}
      </select>
      {!listOnly && p.key ? (
        <>
          <input aria-label={`from ${n}`} className="h-9 rounded border border-steel-300 px-2" placeholder={`from (${unit})`} value={p.from} onChange={(e) => set({ ...p, from: e.target.value })} />
          <input aria-label={`to ${n}`} className="h-9 rounded border border-steel-300 px-2" placeholder={`to (${unit})`} value={p.to} onChange={(e) => set({ ...p, to: e.target.value })} />
          <input aria-label={`step ${n}`} className="h-9 rounded border border-steel-300 px-2" placeholder={`step (${unit})`} value={p.step} onChange={(e) => set({ ...p, step: e.target.value })} />
        </>
      ) : null}
      {p.key ? (
        <input
          aria-label={`list ${n}`}
          className="h-9 rounded border border-steel-300 px-2 md:col-span-1"
          placeholder={p.key === "loading" ? STUDY_LOADINGS.join(", ") : p.key === "chainSpec" ? "chain ids, e.g. 3, 5" : `or a list (${unit})`}
          value={p.list}
          onChange={(e) => set({ ...p, list: e.target.value })}
        />
      ) : null}
    </fieldset>
  );
}

export function StudyList({ units, canRun }: { units: UnitSystem; canRun: boolean }) {
  const router = useRouter();
  const { data, mutate } = useSWR<{ items: StudyView[] }>("/api/studies?pageSize=50", getJson);
  // The listed studies that are queued or running are followed by one event stream; its lines update the list.
  const following = (data?.items ?? []).filter((s) => s.status === "queued" || s.status === "running").map((s) => s.id);
  useJobEvents<{ items: StudyListLine[] }>(following.length ? `/api/studies/events?ids=${following.join(",")}` : null, {
    onUpdate: ({ items }) => {
      const lines = new Map(items.map((l) => [l.id, l]));
      void mutate((d) => d && { ...d, items: d.items.map((s) => ({ ...s, ...lines.get(s.id) })) }, { revalidate: false });
    },
  });
  const { data: scenarios } = useSWR<{ items: { id: number; name: string }[] }>(canRun ? "/api/scenarios?pageSize=100" : null, getJson);
  const [scenarioId, setScenarioId] = useState<number | "">("");
  const [name, setName] = useState("");
  const [p1, setP1] = useState<ParamDraft>({ ...empty, key: "entrySpeed" });
  const [p2, setP2] = useState<ParamDraft>(empty);
  const [segments, setSegments] = useState("24");
  const [duration, setDuration] = useState("");
  const [noArd, setNoArd] = useState(true);
  const [error, setError] = useState<{ message: string; issues?: { path: string; message: string }[] } | null>(null);
  const [busy, once] = useSubmitOnce();

  const create = (e: React.FormEvent) => {
    e.preventDefault();
    void once(async () => {
      setError(null);
      const parameters = [buildParam(p1, units), buildParam(p2, units)].filter(Boolean);
      const settings: Record<string, unknown> = { requireNoArdCatch: noArd };
      const typed = (t: string) => {
        const r = parseNumber(t);
        return r.ok ? r.value : Number.NaN;
      };
      if (segments) settings.segments = typed(segments);
      if (duration) settings.duration = typed(duration);
      const r = await fetch("/api/studies", {
        method: "POST",
        headers: { "Content-Type": "application/json" },
        body: JSON.stringify({ scenarioId: scenarioId === "" ? undefined : scenarioId, name: name || "Study", parameters, settings }),
      });
      const j = await r.json().catch(() => ({}));
      if (!r.ok) return setError({ message: j.error ?? `HTTP ${r.status}`, issues: j.issues });
      router.push(`/studies/${j.study.id}`);
      return "leaving";
    });
  };

  return (
    <div className="space-y-5">
      {canRun ? (
        <Card>
          <CardHeader title="New study" description="Vary one or two inputs of a scenario over a range or a list; every case is a run." />
          <CardBody>
            <form onSubmit={create} className="space-y-3" data-testid="study-form">
              <div className="grid gap-2 text-sm md:grid-cols-2">
                <select aria-label="scenario" className="h-9 rounded border border-steel-300 px-2" value={scenarioId} onChange={(e) => setScenarioId(e.target.value ? Number(e.target.value) : "")}>
                  <option value="">Choose a scenario…</option>
                  {(scenarios?.items ?? []).map((s) => (
                    <option key={s.id} value={s.id}>
                      {s.name}
                    </option>
                  ))}
                </select>
                <input aria-label="study name" className="h-9 rounded border border-steel-300 px-2" placeholder="Study name" value={name} onChange={(e) => setName(e.target.value)} />
              </div>
              <ParamFields n={1} p={p1} set={setP1} units={units} />
              <ParamFields n={2} p={p2} set={setP2} units={units} />
              <div className="flex flex-wrap items-center gap-3 text-sm">
                <label className="flex items-center gap-1">
                  Segments <input aria-label="segments" className="h-8 w-20 rounded border border-steel-300 px-2" value={segments} onChange={(e) => setSegments(e.target.value)} />
                </label>
                <label className="flex items-center gap-1">
                  Duration (s) <input aria-label="duration" className="h-8 w-20 rounded border border-steel-300 px-2" placeholder="scenario's" value={duration} onChange={(e) => setDuration(e.target.value)} />
                </label>
                <label className="flex items-center gap-1">
                  <input type="checkbox" checked={noArd} onChange={(e) => setNoArd(e.target.checked)} /> No settle-back onto the ARD
                </label>
                <Button type="submit" busy={busy} data-testid="study-start">
                  Start study
                </Button>
              </div>
              {error ? (
                <div className="text-sm text-fail" data-testid="study-form-error">
                  <p>{error.message}</p>
                  <ul>
                    {(error.issues ?? []).map((i) => (
                      <li key={i.path}>
                        {placeOf(i.path)} {i.message}
                      </li>
                    ))}
                  </ul>
                </div>
              ) : null}
            </form>
          </CardBody>
        </Card>
      ) : null}
      <Card>
        <CardHeader title="Studies" />
        <CardBody>
          <ul className="divide-y divide-steel-100 text-sm" data-testid="study-list">
            {(data?.items ?? []).map((s) => (
              <li key={s.id} className="flex items-center gap-3 py-2">
                <Link className="font-semibold text-ink-900 underline" href={`/studies/${s.id}`}>
                  {s.name}
                </Link>
                <Badge tone={s.status === "done" ? "pass" : s.status === "failed" ? "fail" : s.status === "cancelled" ? "neutral" : "lamp"}>{s.status}</Badge>
                <span className="text-steel-500">
                  {s.casesDone + s.casesFailed} / {s.casesTotal} cases
                </span>
              </li>
            ))}
            {data && !data.items.length ? <li className="py-2 text-steel-500">No study yet.</li> : null}
          </ul>
        </CardBody>
      </Card>
    </div>
  );
}
