import { NextResponse } from "next/server";
import { z } from "zod";
import { requireOrgUser, updateUser } from "@/lib/auth/accounts";
import { updateUserSchema } from "@/lib/auth/schemas";
import { requirePermission } from "@/lib/auth/session";
import { notFound } from "@/lib/http/errors";
import { parseJsonBody } from "@/lib/http/request";
import { route } from "@/lib/http/route";

export const runtime = "nodejs";

type Ctx = { params: Promise<{ id: string }> };

const idSchema = z.coerce.number().int().positive();

/** Changes a user's role and/or active state (within the admin's own organisation). */
export const PATCH = route<Ctx>(async (req, ctx) => {
  const admin = await requirePermission("users:manage");
  const id = idSchema.safeParse((await ctx.params).id);
  if (!id.success) throw notFound("No such user in your organisation.");
  // Another organisation's user is 404 before the body is even read.
  await requireOrgUser(admin, id.data);
  const input = await parseJsonBody(req, updateUserSchema);
  return NextResponse.json({ user: await updateUser(admin, id.data, input) });
});
