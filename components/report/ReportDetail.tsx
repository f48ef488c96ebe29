"use client";
/**
 * One design-check report: status, the reviewer's return comment, the approval summary a reviewer
 * confirms (headline figures, every check with its state, open cautions), submit / approve / return,
 * and the review history.
 */
import Link from "next/link";
import { useState } from "react";
import type { ReportView } from "@/lib/reports/service";
import { Alert } from "@/components/ui/Alert";
import { Badge } from "@/components/ui/Badge";
import { Button, buttonClass } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { ApiError, sendJson } from "@/lib/client/fetch";
import { useResource } from "@/lib/client/hooks";
import { STATUS_TONE } from "./ReportQueue";

const ACTION_WORDS: Record<string, string> = { submit: "Submitted for review", return: "Returned to the author", approve: "Approved" };
const STATE_TONE = { pass: "pass", caution: "caution", fail: "fail" } as const;

function errorText(err: unknown): string {
  if (err instanceof ApiError) return [err.message, ...err.issues.map((i) => `${i.path}: ${i.message}`)].join(" ");
  return String(err);
}

export function ReportDetail({ reportId, userId, canWrite, canReview }: { reportId: number; userId: number; canWrite: boolean; canReview: boolean }) {
  const { data: r, mutate, error: loadError } = useResource<{ report: ReportView }>(`/api/reports/${reportId}`);
  const [comment, setComment] = useState("");
  const [confirmed, setConfirmed] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function act(url: string, body?: unknown) {
    setBusy(true);
    setError(null);
    try {
      await sendJson(url, "POST", body);
      setComment("");
      setConfirmed(false);
      await mutate();
    } catch (err) {
      setError(errorText(err));
    } finally {
      setBusy(false);
    }
  }

  if (loadError) return <Alert tone="error" title="The report could not be loaded">{errorText(loadError)}</Alert>;
  const report = r?.report;
  if (!report) return <p className="text-[13px] text-steel-500">Loading the report…</p>;
  const summary = report.approvalSummary;
  const isAuthor = report.authorId === userId;
  const mayReview = canReview && !isAuthor && report.status === "submitted";

  return (
    <div className="space-y-5" data-testid="report-detail" data-status={report.status}>
      <div className="flex flex-wrap items-center gap-2 text-[13px]">
        <Badge tone={STATUS_TONE[report.status as keyof typeof STATUS_TONE] ?? "neutral"}>{report.status}</Badge>
        <span className="text-steel-500">
          Scenario{" "}
          <Link className="font-semibold text-ink-800 hover:underline" href={`/scenarios/${report.scenarioId}`}>
            {report.scenarioName ?? report.scenarioId}
          </Link>
          {report.runId ? (
            <>
              {" "}
              · run{" "}
              <Link className="font-semibold text-ink-800 hover:underline" href={`/runs/${report.runId}`}>
                {report.runId}
              </Link>
            </>
          ) : null}
          {report.authorName ? ` · by ${report.authorName}` : ""}
        </span>
        <a className={buttonClass("secondary", "sm", "ml-auto")} href={report.links.pdf} target="_blank" rel="noreferrer" data-testid="report-pdf">
          Open the PDF
        </a>
        {canWrite && isAuthor && (report.status === "draft" || report.status === "returned") && (
          <Button size="sm" busy={busy} onClick={() => void act(`/api/reports/${report.id}/submit`)} data-testid="report-submit">
            {report.status === "returned" ? "Resubmit for review" : "Submit for review"}
          </Button>
        )}
      </div>

      {report.status === "returned" && report.returnComment && (
        <Alert tone="caution" title="Returned by the reviewer" testId="return-comment">
          <p className="whitespace-pre-wrap">{report.returnComment}</p>
          {isAuthor && <p className="mt-1 text-[12.5px]">Change what the comment asks, then resubmit.</p>}
        </Alert>
      )}
      {report.status === "approved" && (
        <Alert tone="success" title="Approved" testId="approved-note">
          Approved {report.approvedAt ? new Date(report.approvedAt).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" }) : ""}. The report keeps every input as
          approved{report.snapshot ? ` (scenario format ${report.snapshot.engine.scenarioFormat ?? "—"}, result format ${report.snapshot.engine.resultFormat ?? "—"})` : ""}; content hash{" "}
          <span className="font-mono text-[11.5px]">{report.contentHash}</span>.
        </Alert>
      )}
      {error && (
        <Alert tone="error" title="Not done" testId="report-action-error">
          {error}
        </Alert>
      )}

      {summary ? (
        <Card data-testid="approval-summary">
          <CardHeader
            title={report.status === "approved" ? "What was approved" : "Approval summary"}
            description="The figures, every check with its state, and the cautions still open: what approval signs. Results support, and never replace, review by a qualified engineer."
          />
          <CardBody className="space-y-4 text-[13px]">
            <dl className="grid grid-cols-1 gap-x-6 gap-y-1 sm:grid-cols-2">
              {summary.figures.map((f) => (
                <div key={f.label} className="flex justify-between gap-3 border-b border-steel-100 py-1">
                  <dt className="text-steel-500">{f.label}</dt>
                  <dd className="font-semibold tabular-nums text-ink-900">{f.value}</dd>
                </div>
              ))}
            </dl>
            <ul className="space-y-1.5" data-testid="summary-checks">
              {summary.checks.map((c) => (
                <li key={c.key} className="flex gap-2">
                  <Badge tone={STATE_TONE[c.state as keyof typeof STATE_TONE] ?? "neutral"}>{c.state}</Badge>
                  <span>
                    <span className="font-semibold">{c.label}</span>: {c.reason}
                  </span>
                </li>
              ))}
            </ul>
            {summary.openCautions.length ? (
              <Alert tone={summary.failing ? "error" : "caution"} title={`${summary.openCautions.length} open caution${summary.openCautions.length === 1 ? "" : "s"}${summary.failing ? `, ${summary.failing} failing` : ""}`} testId="open-cautions">
                <ul className="list-disc pl-4">
                  {summary.openCautions.map((c) => (
                    <li key={c}>{c}</li>
                  ))}
                </ul>
              </Alert>
            ) : (
              <p className="text-pass">Every check passes.</p>
            )}
            <p className="font-mono text-[11px] text-steel-500">Content hash {summary.contentHash}</p>
          </CardBody>
        </Card>
      ) : (
        <Alert tone="caution" title="No summary">The run of this report is no longer available, so its summary cannot be drawn.</Alert>
      )}

      {mayReview && summary && (
        <Card data-testid="review-form">
          <CardHeader title="Review" description="Approve after reading the summary above, or return the report with a comment saying what must change." />
          <CardBody className="space-y-3 text-[13px]">
            <label className="block font-semibold text-steel-600" htmlFor="review-comment">
              Comment (required to return)
            </label>
            <textarea id="review-comment" className="min-h-20 w-full rounded border border-steel-300 p-2" value={comment} onChange={(e) => setComment(e.target.value)} maxLength={5000} data-testid="review-comment" />
            <label className="flex items-start gap-2">
              <input type="checkbox" checked={confirmed} onChange={(e) => setConfirmed(e.target.checked)} className="mt-0.5" data-testid="confirm-summary" />
              <span>
                I have read the approval summary: these figures, checks and {summary.openCautions.length} open caution{summary.openCautions.length === 1 ? "" : "s"}.
              </span>
            </label>
            <div className="flex gap-2">
              <Button
                size="sm"
                busy={busy}
                disabled={!confirmed}
                onClick={() => void act(`/api/reports/${report.id}/approve`, { confirmedHash: summary.contentHash, ...(comment.trim() ? { comment } : {}) })}
                data-testid="review-approve"
              >
                Approve
              </Button>
              <Button size="sm" variant="danger" busy={busy} onClick={() => void act(`/api/reports/${report.id}/return`, { comment })} data-testid="review-return">
                Return to the author
              </Button>
            </div>
          </CardBody>
        </Card>
      )}

      <Card>
        <CardHeader title="Review history" />
        <CardBody>
          <ol className="space-y-2 text-[13px]" data-testid="review-history">
            {(report.reviews ?? []).map((v) => (
              <li key={v.id}>
                <span className="text-steel-500">{new Date(v.at).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" })}</span> — {ACTION_WORDS[v.action] ?? v.action} by{" "}
                {v.userName ?? "a former user"}
                {v.comment ? <p className="ml-4 whitespace-pre-wrap text-ink-800">“{v.comment}”</p> : null}
              </li>
            ))}
            {!report.reviews?.length && <li className="text-steel-500">Not reviewed yet.</li>}
          </ol>
        </CardBody>
      </Card>
    </div>
  );
}
