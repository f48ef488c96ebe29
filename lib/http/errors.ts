import { NextResponse } from "next/server";
import type { ZodError } from "zod";

/** One problem with a request, named by its field path (e.g. "lift.angle"). */
export interface FieldIssue {
  path: string;
  message: string;
}

/** An error that knows its HTTP answer. Route handlers throw it; `respondError` turns it into JSON. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly issues: FieldIssue[] = [],
    readonly headers: Record<string, string> = {},
  ) {
    super(message);
    this.name = "HttpError";
  }
}

export const badRequest = (message: string, issues: FieldIssue[] = []) => new HttpError(400, message, issues);
export const unauthorized = () => new HttpError(401, "Sign in to continue.");
export const forbidden = (message = "Your role may not do this.") => new HttpError(403, message);
export const notFound = (what = "Not found.") => new HttpError(404, what);
export const conflict = (message: string) => new HttpError(409, message);
export const tooManyRequests = (message: string, retryAfterSeconds: number) =>
  new HttpError(429, message, [], { "Retry-After": String(Math.ceil(retryAfterSeconds)) });
export const unavailable = (message: string, retryAfterSeconds = 5) =>
  new HttpError(503, message, [], { "Retry-After": String(Math.ceil(retryAfterSeconds)) });

/** Field paths as dotted strings; an issue on the whole body gets the path "(body)". */
export function zodIssues(error: ZodError): FieldIssue[] {
  return error.issues.map((i) => ({
    path: i.path.length ? i.path.map(String).join(".") : "(body)",
    message: i.message,
  }));
}

export function fromZod(error: ZodError, message = "The request has invalid fields."): HttpError {
  return badRequest(message, zodIssues(error));
}

/** JSON answer for any thrown value; unknown errors become a 500 without internals. */
export function respondError(err: unknown): NextResponse {
  if (err instanceof HttpError) {
    return NextResponse.json(
      { error: err.message, ...(err.issues.length ? { issues: err.issues } : {}) },
      { status: err.status, headers: err.headers },
    );
  }
  console.error(err);
  return NextResponse.json({ error: "Something went wrong on the server." }, { status: 500 });
}
