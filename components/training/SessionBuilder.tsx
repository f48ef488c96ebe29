"use client";
/** A trainer's editor: ordered runs, captions pinned to moments, save, share and invite, who watched what. */
import Link from "next/link";
import { useCallback, useEffect, useState } from "react";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { Field, Input, Select } from "@/components/ui/Field";
import { Table, THead, Td, Th, Tr } from "@/components/ui/Table";
import { ApiError, getJson, sendJson } from "@/lib/client/fetch";
import type { SessionJson } from "./types";

interface Draft {
  runId: number;
  title: string;
  captions: { at: string; text: string }[];
}
interface Progress {
  userId: number;
  name: string;
  email: string;
  items: { itemId: number; watchedTo: number; completed: boolean; lastAt: string }[];
}

export function SessionBuilder({ initial, runs }: { initial: SessionJson; runs: { id: number; label: string; duration: number }[] }) {
  const [session, setSession] = useState(initial);
  const [title, setTitle] = useState(initial.title);
  const [items, setItems] = useState<Draft[]>(initial.items.map((i) => ({ runId: i.runId, title: i.title ?? "", captions: i.captions.map((c) => ({ at: String(c.at), text: c.text })) })));
  const [msg, setMsg] = useState<{ tone: "error" | "success"; text: string; issues?: string[] } | null>(null);
  const [invite, setInvite] = useState("");
  const [progress, setProgress] = useState<Progress[]>([]);

  const loadProgress = useCallback(() => {
    getJson<{ progress: Progress[] }>(`/api/training/sessions/${session.id}/views`)
      .then((p) => setProgress(p.progress))
      .catch(() => {});
  }, [session.id]);
  useEffect(loadProgress, [loadProgress]);

  const update = (k: number, d: Partial<Draft>) => setItems(items.map((it, j) => (j === k ? { ...it, ...d } : it)));
  const move = (k: number, by: number) => {
    const next = [...items];
    const [x] = next.splice(k, 1);
    next.splice(k + by, 0, x);
    setItems(next);
  };
  const fail = (err: unknown) =>
    setMsg({ tone: "error", text: err instanceof Error ? err.message : String(err), issues: err instanceof ApiError ? err.issues.map((i) => `${i.path}: ${i.message}`) : [] });

  const save = async () => {
    try {
      const s = await sendJson<SessionJson>(`/api/training/sessions/${session.id}`, "PATCH", {
        version: session.version,
        title,
        items: items.map((it) => ({ runId: it.runId, title: it.title || null, captions: it.captions.map((c) => ({ at: Number(c.at), text: c.text })) })),
      });
      setSession(s);
      setMsg({ tone: "success", text: "Saved." });
    } catch (err) {
      fail(err);
    }
  };
  const share = async () => {
    try {
      const r = await sendJson<{ session: SessionJson; mailed: string[] }>(`/api/training/sessions/${session.id}/share`, "POST", {
        invite: invite.split(/[\s,;]+/).filter(Boolean),
      });
      setSession(r.session);
      setMsg({ tone: "success", text: `Shared with the organisation's viewers; e-mailed ${r.mailed.length} people.` });
    } catch (err) {
      fail(err);
    }
  };

  return (
    <div className="space-y-5" data-testid="session-builder">
      <Card>
        <CardHeader
          title="Session"
          description={session.sharedAt ? `Shared ${new Date(session.sharedAt).toLocaleString("en-GB")}` : "Draft: only trainers see it until you share it."}
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
                  <Button size="sm" variant="ghost" onClick={() => setItems(items.filter((_, j) => j !== k))}>
                    Remove
                  </Button>
                </div>
              }
            />
            <CardBody className="space-y-3">
              <div className="grid gap-3 md:grid-cols-2">
                <Field label="Run" name={`run-${k}`}>
                  <Select id={`run-${k}`} value={it.runId} onChange={(e) => update(k, { runId: Number(e.target.value) })}>
                    {runs.map((r) => (
                      <option key={r.id} value={r.id}>
                        {r.label}
                      </option>
                    ))}
                  </Select>
                </Field>
                <Field label="Heading (optional)" name={`heading-${k}`}>
                  <Input id={`heading-${k}`} value={it.title} onChange={(e) => update(k, { title: e.target.value })} />
                </Field>
              </div>
              {it.captions.map((c, j) => (
                <div key={j} className="flex items-end gap-2">
                  <Field label="At, s" name={`cap-at-${k}-${j}`} className="w-24">
                    <Input id={`cap-at-${k}-${j}`} inputMode="decimal" value={c.at} onChange={(e) => update(k, { captions: it.captions.map((x, i) => (i === j ? { ...x, at: e.target.value } : x)) })} />
                  </Field>
                  <Field label="Caption" name={`cap-text-${k}-${j}`} className="flex-1">
                    <Input id={`cap-text-${k}-${j}`} value={c.text} onChange={(e) => update(k, { captions: it.captions.map((x, i) => (i === j ? { ...x, text: e.target.value } : x)) })} />
                  </Field>
                  <Button size="sm" variant="ghost" onClick={() => update(k, { captions: it.captions.filter((_, i) => i !== j) })}>
                    Remove
                  </Button>
                </div>
              ))}
              <Button size="sm" variant="secondary" onClick={() => update(k, { captions: [...it.captions, { at: "", text: "" }] })} data-testid={`add-caption-${k}`}>
                Add a caption
              </Button>
            </CardBody>
          </Card>
        );
      })}
      <div className="flex flex-wrap gap-3">
        <Button variant="secondary" disabled={runs.length === 0} onClick={() => setItems([...items, { runId: runs[0].id, title: "", captions: [] }])} data-testid="add-run">
          Add a run
        </Button>
        <Button onClick={() => void save()} data-testid="save-session">
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
          <Button onClick={() => void share()} data-testid="share-session">
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
