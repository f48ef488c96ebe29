"use client";
/** Review comments about one run (stored with its scenario): read, add, and remove your own. */
import { useState } from "react";
import type { CommentView } from "@/lib/comments/service";
import type { Jsonify } from "@/lib/client/jsonify";
import { Button } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { ApiError, sendJson } from "@/lib/client/fetch";
import { useList } from "@/lib/client/hooks";

type CommentJson = Jsonify<CommentView>;

export function RunComments({ scenarioId, runId, userId, canWrite, isAdmin }: { scenarioId: number; runId: number; userId: number; canWrite: boolean; isAdmin: boolean }) {
  const base = `/api/scenarios/${scenarioId}/comments`;
  const list = useList<CommentJson>(base, { runId, pageSize: 100, sort: "createdAt", order: "asc" });
  const [body, setBody] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function act(fn: () => Promise<unknown>) {
    setBusy(true);
    setError(null);
    try {
      await fn();
      await list.mutate();
      return true;
    } catch (err) {
      setError(err instanceof ApiError ? [err.message, ...err.issues.map((i) => `${i.path}: ${i.message}`)].join(" ") : String(err));
      return false;
    } finally {
      setBusy(false);
    }
  }

  const items = list.data?.items ?? [];
  return (
    <Card className="mt-5" data-testid="run-comments">
      <CardHeader title="Review comments on this run" description="Comments stay with the scenario's record; a run with comments cannot be deleted." />
      <CardBody className="space-y-3">
        <ul className="space-y-2">
          {items.map((c) => (
            <li key={c.id} className="rounded border border-steel-200 p-3 text-[13px]" data-testid="run-comment">
              <div className="mb-1 flex items-center gap-2 text-[11.5px] text-steel-500">
                <span className="font-semibold text-ink-800">{c.author?.name ?? "A former user"}</span>
                <span>{new Date(c.createdAt).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" })}</span>
                {canWrite && (c.author?.id === userId || isAdmin) && (
                  <button className="ml-auto text-fail hover:underline" disabled={busy} onClick={() => void act(() => sendJson(`${base}/${c.id}`, "DELETE"))}>
                    Remove
                  </button>
                )}
              </div>
              <p className="whitespace-pre-wrap text-ink-900">{c.body}</p>
            </li>
          ))}
          {list.data && !items.length && <li className="text-[13px] text-steel-500">No comments on this run yet.</li>}
        </ul>
        {canWrite && (
          <form
            className="space-y-2"
            onSubmit={(e) => {
              e.preventDefault();
              void act(() => sendJson(base, "POST", { body, runId })).then((ok) => ok && setBody(""));
            }}
          >
            <label className="block text-[12.5px] font-semibold text-steel-600" htmlFor="run-comment-body">
              Add a comment
            </label>
            <textarea
              id="run-comment-body"
              className="min-h-20 w-full rounded border border-steel-300 p-2 text-[13px]"
              value={body}
              onChange={(e) => setBody(e.target.value)}
              maxLength={5000}
              data-testid="run-comment-input"
            />
            <Button size="sm" type="submit" busy={busy} disabled={!body.trim()} data-testid="run-comment-add">
              Add comment
            </Button>
          </form>
        )}
        {error && (
          <p className="text-[13px] text-fail" role="alert" data-testid="run-comment-error">
            {error}
          </p>
        )}
      </CardBody>
    </Card>
  );
}
