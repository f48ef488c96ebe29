import { parseJsonBody, readBodyText } from "@/lib/http/request";
import { startRunSchema, type StartRunInput } from "./schema";

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
