import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { parseQuery } from "@/lib/http/request";
import { requirePermission } from "@/lib/auth/session";
import { getStudy } from "@/lib/studies/service";
import { exportQuerySchema } from "@/lib/studies/http";
import { studyCsv, studyXlsx } from "@/lib/studies/export";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** The case table as a download: ?format=csv|xlsx&units=si|us */
export const GET = route<RouteContext>(async (req, ctx) => {
  const user = await requirePermission("study:read");
  const id = parseId((await ctx.params).id, "Study not found.");
  const q = parseQuery(req, exportQuerySchema);
  const units = q.units ?? user.units;
  const format = q.format;
  const study = await getStudy(user, id, { units });
  const name = `tautline-study-${id}`;
  if (format === "xlsx") {
    const body = await studyXlsx(study, units);
    return new NextResponse(new Uint8Array(body), {
      headers: {
        "Content-Type": "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet",
        "Content-Disposition": `attachment; filename="${name}.xlsx"`,
      },
    });
  }
  return new NextResponse(studyCsv(study, units), {
    headers: { "Content-Type": "text/csv; charset=utf-8", "Content-Disposition": `attachment; filename="${name}.csv"` },
  });
});
