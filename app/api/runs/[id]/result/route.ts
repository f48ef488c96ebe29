import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { parseQuery } from "@/lib/http/request";
import { requirePermission } from "@/lib/auth/session";
import { getRunResult, getRunResultBlob } from "@/lib/runs/service";
import { resultQuerySchema } from "@/lib/runs/schema";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/**
 * The result of a finished run. Default: JSON { runId, format, summary, result: { series, frames, notes } }.
 * `?format=binary` (or Accept: application/octet-stream): the stored gzipped tautline-result/1 blob.
 */
export const GET = route<RouteContext>(async (req, ctx) => {
  const user = await requirePermission("run:read");
  const runId = parseId((await ctx.params).id, "Run not found.");
  const { format } = parseQuery(req, resultQuerySchema);
  const wantsBinary = format === "binary" || (!format && (req.headers.get("accept") ?? "").includes("application/octet-stream"));
  if (wantsBinary) {
    const { run, blob } = await getRunResultBlob(user, runId);
    return new NextResponse(new Uint8Array(blob), {
      headers: {
        "Content-Type": "application/octet-stream",
        "Content-Disposition": `attachment; filename="run-${run.id}.tlr.gz"`,
        "X-Tautline-Result-Format": run.resultFormat ?? "",
        "Cache-Control": "private, max-age=31536000, immutable",
      },
    });
  }
  return NextResponse.json(await getRunResult(user, runId), { headers: { "Cache-Control": "private, max-age=31536000, immutable" } });
});
