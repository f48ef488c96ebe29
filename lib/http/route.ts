import type { NextResponse } from "next/server";
import { dbHttpError } from "@/lib/db/health";
import { crossSiteRefusal } from "@/lib/security/origin";
import { respondError } from "./errors";

type Handler<C> = (req: Request, ctx: C) => Promise<Response | NextResponse>;

/**
 * Wraps a route handler so that any thrown HttpError (or unexpected error) becomes a JSON answer, and a
 * lost database connection becomes a 503 with Retry-After instead of a 500.
 * A state-changing request from another site is refused with 403 before the handler runs
 * (lib/security/origin.ts). Route handlers stay thin: validate, authorise, call lib/, answer.
 */
export function route<C = unknown>(handler: Handler<C>): Handler<C> {
  return async (req, ctx) => {
    const refused = crossSiteRefusal(req);
    if (refused) return respondError(refused);
    try {
      return await handler(req, ctx);
    } catch (err) {
      return respondError(dbHttpError(err));
    }
  };
}
