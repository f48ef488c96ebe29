import { notFound } from "@/lib/http/errors";
import { parseJsonBody, readBodyText } from "@/lib/http/request";
import { startRunSchema, type StartRunInput } from "./schema";

export interface IdParams {
  params: Promise<{ id: string }>;
}

/** The numeric id of a dynamic segment; anything else is a missing row (404). */
export async function idFrom(ctx: IdParams, what: string): Promise<number> {
  const { id } = await ctx.params;
  const n = Number(id);
  if (!/^\d{1,10}$/.test(id) || !Number.isSafeInteger(n) || n < 1) throw notFound(what);
  return n;
}

/** The start-run body is optional: no body (or an empty one) means "the scenario's own settings". */
export async function parseStartRunBody(req: Request): Promise<StartRunInput> {
  const length = req.headers.get("content-length");
  if (!req.body || length === "0") return {};
  if (!req.headers.get("content-type")) {
    const text = await readBodyText(req);
    if (text.trim() === "") return {};
    return parseJsonBody(new Request(req.url, { method: "POST", headers: { "content-type": "application/json" }, body: text }), startRunSchema);
  }
  return parseJsonBody(req, startRunSchema);
}
