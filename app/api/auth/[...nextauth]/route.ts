import NextAuth from "next-auth/next";
import { NextRequest } from "next/server";
import { getAuthOptions } from "@/lib/auth/options";
import { claimedAddress, clientAddress } from "@/lib/security/client-address";
import { signInAllowed, RATE_LIMITED_ERROR } from "@/lib/auth/sign-in";
import { emailSchema } from "@/lib/auth/schemas";
import { readBodyBytes } from "@/lib/http/request";
import { respondError } from "@/lib/http/errors";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ nextauth: string[] }> };

async function handle(req: NextRequest, ctx: Ctx) {
  return NextAuth(req, ctx, getAuthOptions());
}

export const GET = handle;

/**
 * The credentials callback answers 429 (with Retry-After) once the account or the address is over its
 * failed sign-in limit, before next-auth runs. The body keeps next-auth's `{ url }` shape so the sign-in
 * form (next-auth/react `signIn`) reads `error=RateLimited` from it.
 */
export async function POST(original: NextRequest, ctx: Ctx) {
  let req: NextRequest;
  try {
    req = await boundedCopy(original);
  } catch (err) {
    return respondError(err);
  }
  const { nextauth } = await ctx.params;
  if (nextauth[0] === "callback" && nextauth[1] === "credentials") {
    const form = await req.clone().formData().catch(() => null);
    const email = emailSchema.safeParse(form?.get("email") ?? "");
    const decision = await signInAllowed(email.success ? email.data : "", { address: clientAddress(req.headers), claimed: claimedAddress(req.headers) });
    if (!decision.allowed) {
      const url = new URL("/sign-in", req.nextUrl.origin);
      url.searchParams.set("error", RATE_LIMITED_ERROR);
      return Response.json(
        {
          error: `Too many failed sign-ins. Try again in ${Math.ceil(decision.retryAfterSeconds / 60)} minute(s).`,
          url: url.toString(),
        },
        { status: 429, headers: { "Retry-After": String(decision.retryAfterSeconds) } },
      );
    }
  }
  return handle(req, ctx);
}

// Sign-in forms are a few hundred bytes; the body is read within a limit before next-auth reads it whole.
const AUTH_BODY_MAX_BYTES = 16 * 1024;

async function boundedCopy(req: NextRequest): Promise<NextRequest> {
  const body = await readBodyBytes(req, AUTH_BODY_MAX_BYTES);
  const headers = new Headers(req.headers);
  headers.delete("content-length");
  headers.delete("transfer-encoding");
  return new NextRequest(req.url, { method: req.method, headers, body });
}
