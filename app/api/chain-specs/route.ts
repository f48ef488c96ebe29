import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { cachedRead } from "@/lib/http/read-cache";
import { parseJsonBody, parseQuery } from "@/lib/http/request";
import { createChainSpec, listChainSpecs } from "@/lib/chains/service";

export const runtime = "nodejs";

/** The standard catalogue plus the organisation's own chains: ?scope=all|standard|own&q&sort&order&page&pageSize&archived. */
export const GET = route(async (req) => {
  const actor = await requirePermission("design:read");
  return cachedRead(req, actor, async () => listChainSpecs(actor, parseQuery(req)));
});

/** A chain of the organisation's own (e.g. its manufacturer's data sheet values). */
export const POST = route(async (req) => {
  const actor = await requirePermission("design:write");
  return NextResponse.json(await createChainSpec(actor, await parseJsonBody(req)), { status: 201 });
});
