import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { parseQuery } from "@/lib/http/request";
import { requirePermission } from "@/lib/auth/session";
import { getRunResultBlob, getRunResultStream } from "@/lib/runs/service";
import { resultQuerySchema } from "@/lib/runs/schema";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/**
 * The result of a finished run. Default: JSON { runId, format, summary, result: { series, frames, notes } }.
 * `?format=binary` (or Accept: application/octet-stream): the stored gzipped tautline-result/1 blob.
 * The JSON is streamed in slices (lib/runs/result-stream.ts): a 20 MB answer never holds the server.
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
  return new Response(await getRunResultStream(user, runId), {
    headers: { "Content-Type": "application/json", "Cache-Control": "private, max-age=31536000, immutable" },
  });
});
