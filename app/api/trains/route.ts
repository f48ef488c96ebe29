import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { cachedRead } from "@/lib/http/read-cache";
import { parseJsonBody, parseQuery } from "@/lib/http/request";
import { createTrain, listTrains } from "@/lib/trains/service";

export const runtime = "nodejs";

/** Trains of the organisation: ?page&pageSize&sort=name|cars|carMassEmpty|createdAt|updatedAt&order&q&archived. */
export const GET = route(async (req) => {
  const actor = await requirePermission("design:read");
  return cachedRead(req, actor, async () => listTrains(actor, parseQuery(req)));
});

export const POST = route(async (req) => {
  const actor = await requirePermission("design:write");
  return NextResponse.json(await createTrain(actor, await parseJsonBody(req)), { status: 201 });
});
