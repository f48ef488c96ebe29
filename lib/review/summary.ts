/**
 * The approval summary: what a reviewer approves, in words and the report's units — the headline
 * figures, every check with its state, and the open cautions (checks not passing). The reviewer
 * confirms it by sending back the content hash it was drawn from, so an approval always names the exact
 * content the reviewer read.
 */
import type { ReportContent } from "@/lib/reports/content";
import { headlineFigures } from "@/lib/reports/figures";

export interface ApprovalSummary {
  contentHash: string;
  run: { id: number; finishedAt: string | null } | null;
  figures: { label: string; value: string }[];
  checks: { key: string; label: string; state: string; reason: string }[];
  /** Checks in caution or fail, in words: what the reviewer accepts by approving. */
  openCautions: string[];
  failing: number;
}

export function approvalSummary(content: ReportContent, contentHash: string): ApprovalSummary {
  const open = content.checks.filter((c) => c.state !== "pass");
  return {
    contentHash,
    run: content.run ? { id: content.run.id, finishedAt: content.run.finishedAt } : null,
    figures: headlineFigures(content).map(([label, value]) => ({ label, value })),
    checks: content.checks.map((c) => ({ key: c.key, label: c.label, state: c.state, reason: c.reason })),
    openCautions: open.map((c) => `${c.label} (${c.state}): ${c.reason}`),
    failing: open.filter((c) => c.state === "fail").length,
  };
}
