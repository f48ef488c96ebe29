import { NextResponse } from "next/server";
import { z } from "zod";
import { appBaseUrl, resendInvite } from "@/lib/auth/accounts";
import { requirePermission } from "@/lib/auth/session";
import { notFound } from "@/lib/http/errors";
import { route } from "@/lib/http/route";

export const runtime = "nodejs";

type Ctx = { params: Promise<{ id: string }> };

const idSchema = z.coerce.number().int().positive();

/** Sends a fresh invitation link to a user who has not accepted yet; earlier links stop working. */
export const POST = route<Ctx>(async (req, ctx) => {
  const admin = await requirePermission("users:manage");
  const id = idSchema.safeParse((await ctx.params).id);
  if (!id.success) throw notFound("No such user in your organisation.");
  return NextResponse.json({ user: await resendInvite(admin, id.data, appBaseUrl(req)) });
});
