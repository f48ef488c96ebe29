"use client";
/** Shown on an approved (frozen) scenario: what froze it, and the way to keep working on a copy. */
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { ApiError, sendJson } from "@/lib/client/fetch";

export function FrozenScenarioBanner({
  scenarioId,
  frozenAt,
  report,
  canCopy,
}: {
  scenarioId: number;
  frozenAt: string;
  report: { id: number; title: string } | null;
  canCopy: boolean;
}) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function copy() {
    setBusy(true);
    setError(null);
    try {
      const res = await sendJson<{ scenario?: { id: number }; id?: number }>(`/api/scenarios/${scenarioId}/copy`, "POST", {});
      const id = res.scenario?.id ?? res.id;
      if (id) router.push(`/scenarios/${id}`);
    } catch (err) {
      setError(err instanceof ApiError ? err.message : String(err));
      setBusy(false);
    }
  }

  return (
    <Alert tone="info" title="Approved: this scenario is frozen" testId="frozen-banner">
      <p>
        It was approved on {new Date(frozenAt).toLocaleDateString("en-GB", { dateStyle: "medium" })}
        {report ? (
          <>
            {" "}
            in the design check{" "}
            <Link className="font-semibold underline" href={`/reports/${report.id}`}>
              {report.title}
            </Link>
          </>
        ) : null}
        . Its inputs, train and runs stay as approved; edits of its train or lift go to new copies and revisions. To change it, work on a copy.
      </p>
      {canCopy && (
        <Button size="sm" className="mt-2" busy={busy} onClick={() => void copy()} data-testid="copy-frozen-scenario">
          Copy to a new scenario
        </Button>
      )}
      {error && <p className="mt-1 text-fail">{error}</p>}
    </Alert>
  );
}
