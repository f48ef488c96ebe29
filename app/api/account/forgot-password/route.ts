import { NextResponse } from "next/server";
import { appBaseUrl, FORGOT_PASSWORD_ANSWER, requestPasswordReset } from "@/lib/auth/accounts";
import { clientAddress } from "@/lib/security/client-address";
import { forgotPasswordSchema } from "@/lib/auth/schemas";
import { tooManyRequests } from "@/lib/http/errors";
import { parseJsonBody } from "@/lib/http/request";
import { route } from "@/lib/http/route";

export const runtime = "nodejs";

/** Always the same answer whether or not the address has an account. */
export const POST = route(async (req) => {
  const { email } = await parseJsonBody(req, forgotPasswordSchema);
  const result = await requestPasswordReset(email, clientAddress(req.headers), appBaseUrl(req));
  if (!result.allowed) {
    throw tooManyRequests("Too many reset requests from this address. Try again later.", result.retryAfterSeconds);
  }
  return NextResponse.json({ message: FORGOT_PASSWORD_ANSWER }, { status: 202 });
});
