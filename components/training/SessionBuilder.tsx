"use client";
/** A trainer's editor: ordered runs, captions pinned to moments, save, share and invite, who watched what. */
import Link from "next/link";
import { useCallback, useEffect, useState } from "react";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { Field, Input, Options, Select } from "@/components/ui/Field";
import { Table, THead, Td, Th, Tr } from "@/components/ui/Table";
import { ApiError, getJson, sendJson } from "@/lib/client/fetch";
import { NumberInput } from "@/components/ui/NumberInput";
import { useSubmitOnce } from "@/components/ui/useSubmitOnce";
import type { SessionJson } from "./types";
import { PinReplay } from "./PinReplay";
import type { UnitSystem } from "@/lib/client/units";
import { formatDate } from "@/lib/client/dates";

/** "items.1.captions.0.at" → "Run 2, caption 1, time:" (never the dotted path). */
function placeOf(path: string): string {
  const m = /^items\.(\d+)(?:\.captions\.(\d+)(?:\.(at|text))?)?/.exec(path);
  if (!m) return path === "title" ? "Title:" : path === "version" ? "" : "";
  const parts = [`Run ${Number(m[1]) + 1}`];
  if (m[2] !== undefined) parts.push(`caption ${Number(m[2]) + 1}`);
  if (m[3]) parts.push(m[3] === "at" ? "time" : "text");
  return `${parts.join(", ")}:`;
}

function captionProblems(items: Draft[], runs: { id: number; duration: number }[]): Record<string, string> {
  const out: Record<string, string> = {};
  items.forEach((it, k) => {
    const duration = runs.find((r) => r.id === it.runId)?.duration;
    it.captions.forEach((c, j) => {
      const path = `items.${k}.captions.${j}.at`;
      if (c.at === undefined) out[path] = `Run ${k + 1}, caption ${j + 1}: the time is required (s)`;
      else if (!Number.isFinite(c.at) || c.at < 0) out[path] = `Run ${k + 1}, caption ${j + 1}: the time must be a number of seconds, 0 or more`;
      else if (duration !== undefined && duration > 0 && c.at > duration) out[path] = `Run ${k + 1}, caption ${j + 1}: the time must be within the run's ${duration} s`;
    });
  });
  return out;
}

interface Draft {
  runId: number;
  title: string;
  /** Seconds into the run (undefined while empty, NaN while not a number). */
  captions: { at: number | undefined; text: string }[];
}
interface Progress {
  userId: number;
  name: string;
  email: string;
  items: { itemId: number; watchedTo: number; completed: boolean; lastAt: string }[];
}

export function SessionBuilder({ initial, runs, units = "si" }: { initial: SessionJson; runs: { id: number; label: string; duration: number }[]; units?: UnitSystem }) {
  const [session, setSession] = useState(initial);
  const [title, setTitle] = useState(initial.title);
  const [items, setItems] = useState<Draft[]>(initial.items.map((i) => ({ runId: i.runId, title: i.title ?? "", captions: i.captions.map((c) => ({ at: c.at, text: c.text })) })));
  const [msg, setMsg] = useState<{ tone: "error" | "success"; text: string; issues?: string[] } | null>(null);
  const [invite, setInvite] = useState("");
  const [progress, setProgress] = useState<Progress[]>([]);
  /** The run item whose replay is open to pin captions at its moments (one at a time: one replay clock). */
  const [replayOf, setReplayOf] = useState<number | null>(null);

  const loadProgress = useCallback(() => {
    getJson<{ progress: Progress[] }>(`/api/training/sessions/${session.id}/views`)
      .then((p) => setProgress(p.progress))
      .catch(() => {});
  }, [session.id]);
  useEffect(loadProgress, [loadProgress]);

  const update = (k: number, d: Partial<Draft>) => setItems(items.map((it, j) => (j === k ? { ...it, ...d } : it)));
  const move = (k: number, by: number) => {
    setReplayOf(null);
    const next = [...items];
    const [x] = next.splice(k, 1);
    next.splice(k + by, 0, x);
    setItems(next);
  };
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [saving, once] = useSubmitOnce();
  const fail = (err: unknown) => {
    const issues = err instanceof ApiError ? err.issues : [];
    setFieldErrors(Object.fromEntries(issues.map((i) => [i.path, `${placeOf(i.path)} ${i.message}`])));
    setMsg({ tone: "error", text: err instanceof Error ? err.message : String(err), issues: issues.map((i) => `${placeOf(i.path)} ${i.message}`) });
  };

  const save = () =>
    once(async () => {
      // Caption times within their run, checked here too so every problem shows at once before sending.
      const local = captionProblems(items, runs);
      setFieldErrors(local);
      if (Object.keys(local).length) {
        setMsg({ tone: "error", text: "Some captions need attention. Nothing was saved.", issues: Object.values(local) });
        return;
      }
      try {
        const s = await sendJson<SessionJson>(`/api/training/sessions/${session.id}`, "PATCH", {
          version: session.version,
          title,
          items: items.map((it) => ({ runId: it.runId, title: it.title || null, captions: it.captions.map((c) => ({ at: c.at, text: c.text })) })),
        });
        setSession(s);
        setMsg({ tone: "success", text: "Saved." });
      } catch (err) {
        fail(err);
      }
    });
  const share = () =>
    once(async () => {
    try {
      const r = await sendJson<{ session: SessionJson; mailed: string[] }>(`/api/training/sessions/${session.id}/share`, "POST", {
        invite: invite.split(/[\s,;]+/).filter(Boolean),
      });
      setSession(r.session);
      setMsg({ tone: "success", text: `Shared with the organisation's viewers; e-mailed ${r.mailed.length} people.` });
    } catch (err) {
      fail(err);
    }
    });

  return (
    <div className="space-y-5" data-testid="session-builder">
      <Card>
        <CardHeader
          title="Session"
          description={session.sharedAt ? `Shared ${formatDate(session.sharedAt, "dayTime")}` : "Draft: only trainers see it until you share it."}
          actions={
            <Link href={`/replays/${session.id}`} className="text-[13.5px] font-semibold text-lamp-600 hover:underline">
              Play
            </Link>
          }
        />
        <CardBody>
          <Field label="Title" name="title">
            <Input id="title" value={title} onChange={(e) => setTitle(e.target.value)} />
          </Field>
        </CardBody>
      </Card>
      {items.map((it, k) => {
        const run = runs.find((r) => r.id === it.runId);
        return (
          <Card key={k} data-testid={`builder-item-${k}`}>
            <CardHeader
              title={`${k + 1}. ${run?.label ?? `Run ${it.runId}`}`}
              description={run ? `${run.duration} s` : undefined}
              actions={
                <div className="flex gap-1">
                  <Button size="sm" variant="ghost" disabled={k === 0} onClick={() => move(k, -1)}>
                    Up
                  </Button>
                  <Button size="sm" variant="ghost" disabled={k === items.length - 1} onClick={() => move(k, 1)}>
                    Down
                  </Button>
                  <Button
                    size="sm"
                    variant="ghost"
                    onClick={() => {
                      setReplayOf(null);
                      setItems(items.filter((_, j) => j !== k));
                    }}
                  >
                    Remove
                  </Button>
                </div>
              }
            />
            <CardBody className="space-y-3">
              <div className="grid gap-3 md:grid-cols-2">
                <Field label="Run" name={`run-${k}`}>
                  <Select id={`run-${k}`} value={it.runId} onChange={(e) => update(k, { runId: Number(e.target.value) })}>
                    <Options items={runs} label={(r) => r.label} />
                  </Select>
                </Field>
                <Field label="Heading (optional)" name={`heading-${k}`}>
                  <Input id={`heading-${k}`} value={it.title} onChange={(e) => update(k, { title: e.target.value })} />
                </Field>
              </div>
              {it.captions.map((c, j) => (
                <div key={j} className="flex items-end gap-2">
                  <div className="w-32">
                    <NumberInput
                      id={`cap-at-${k}-${j}`}
                      def={{ path: `items.${k}.captions.${j}.at`, label: "At", q: "time" }}
                      units="si"
                      value={c.at}
                      error={fieldErrors[`items.${k}.captions.${j}.at`]}
                      onChange={(at) => update(k, { captions: it.captions.map((x, i) => (i === j ? { ...x, at } : x)) })}
                    />
                  </div>
                  <Field label="Caption" name={`cap-text-${k}-${j}`} className="flex-1">
                    <Input id={`cap-text-${k}-${j}`} value={c.text} onChange={(e) => update(k, { captions: it.captions.map((x, i) => (i === j ? { ...x, text: e.target.value } : x)) })} />
                  </Field>
                  <Button size="sm" variant="ghost" onClick={() => update(k, { captions: it.captions.filter((_, i) => i !== j) })}>
                    Remove
                  </Button>
                </div>
              ))}
              <div className="flex flex-wrap gap-2">
                <Button size="sm" variant="secondary" onClick={() => update(k, { captions: [...it.captions, { at: undefined, text: "" }] })} data-testid={`add-caption-${k}`}>
                  Add a caption
                </Button>
                <Button size="sm" variant="ghost" onClick={() => setReplayOf(replayOf === k ? null : k)} data-testid={`show-replay-${k}`}>
                  {replayOf === k ? "Hide the replay" : "Find a moment in the replay"}
                </Button>
              </div>
              {replayOf === k && (
                <PinReplay
                  runId={it.runId}
                  duration={run?.duration ?? 0}
                  units={units}
                  index={k}
                  onPin={(at) => update(k, { captions: [...it.captions, { at, text: "" }] })}
                />
              )}
            </CardBody>
          </Card>
        );
      })}
      <div className="flex flex-wrap gap-3">
        <Button variant="secondary" disabled={runs.length === 0} onClick={() => setItems([...items, { runId: runs[0].id, title: "", captions: [] }])} data-testid="add-run">
          Add a run
        </Button>
        <Button onClick={() => void save()} busy={saving} data-testid="save-session">
          Save the session
        </Button>
      </div>
      {msg && (
        <Alert tone={msg.tone} title={msg.text} testId="session-message">
          {msg.issues && msg.issues.length > 0 && (
            <ul className="list-disc pl-5">
              {msg.issues.map((i) => (
                <li key={i}>{i}</li>
              ))}
            </ul>
          )}
        </Alert>
      )}
      <Card>
        <CardHeader title="Share" description="Viewers of your organisation are e-mailed a link; add the e-mail of anyone else in the organisation to invite them too." />
        <CardBody className="flex flex-wrap items-end gap-3">
          <Field label="Also invite (e-mail addresses)" name="invite" className="w-96">
            <Input id="invite" value={invite} onChange={(e) => setInvite(e.target.value)} />
          </Field>
          <Button onClick={() => void share()} busy={saving} data-testid="share-session">
            {session.sharedAt ? "Share again" : "Share with the organisation"}
          </Button>
        </CardBody>
      </Card>
      <Card>
        <CardHeader title="Who watched what" actions={<Button size="sm" variant="ghost" onClick={loadProgress}>Refresh</Button>} />
        <CardBody>
          {progress.length === 0 ? (
            <p className="text-[13px] text-steel-500">Nobody has watched it yet.</p>
          ) : (
            <Table>
              <THead>
                <Tr>
                  <Th>Person</Th>
                  {session.items.map((i, k) => (
                    <Th key={i.id}>Run {k + 1}</Th>
                  ))}
                </Tr>
              </THead>
              <tbody data-testid="progress">
                {progress.map((p) => (
                  <Tr key={p.userId}>
                    <Td>{p.name}</Td>
                    {session.items.map((i) => {
                      const v = p.items.find((x) => x.itemId === i.id);
                      return <Td key={i.id}>{v ? (v.completed ? "watched" : `to ${v.watchedTo.toFixed(0)} s`) : "—"}</Td>;
                    })}
                  </Tr>
                ))}
              </tbody>
            </Table>
          )}
        </CardBody>
      </Card>
    </div>
  );
}
