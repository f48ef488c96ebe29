import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseJsonBody, parseQuery } from "@/lib/http/request";
import { idempotencyKeyOf } from "@/lib/http/idempotency";
import { createEntry, listEntries } from "@/lib/logbook/service";

export const runtime = "nodejs";

/** Entries of one lift: ?liftId=&kind=&from=&to=&page=&pageSize= */
export const GET = route(async (req) => {
  const actor = await requirePermission("logbook:read");
  return NextResponse.json(await listEntries(actor, parseQuery(req)));
});

/**
 * A new entry; the answer names any alerts it raised (those are e-mailed once). With an Idempotency-Key
 * header, a retry of a write that was committed is answered from that entry (200) instead of adding one.
 */
export const POST = route(async (req) => {
  const actor = await requirePermission("logbook:write");
  const idempotencyKey = idempotencyKeyOf(req);
  const answer = await createEntry(actor, await parseJsonBody(req), { idempotencyKey });
  return NextResponse.json(answer, { status: answer.replayed ? 200 : 201 });
});
