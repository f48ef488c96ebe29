import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { badRequest, HttpError } from "@/lib/http/errors";
import { readFormData } from "@/lib/http/request";
import { PHOTO_MAX_BYTES, storePhoto } from "@/lib/logbook/uploads";

export const runtime = "nodejs";

/** An inspection photo: multipart/form-data with `liftId` and `file`. Checked by content, size-limited. */
export const POST = route(async (req) => {
  const actor = await requirePermission("logbook:write");
  if (!(req.headers.get("content-type") ?? "").startsWith("multipart/form-data"))
    throw badRequest("Send the photo as multipart/form-data.", [{ path: "file", message: "a file field is required" }]);
  let form: FormData;
  try {
    form = await readFormData(req, PHOTO_MAX_BYTES + 64 * 1024);
  } catch (err) {
    if (err instanceof HttpError) throw new HttpError(413, `The photo is larger than ${Math.round(PHOTO_MAX_BYTES / 1024 / 1024)} MiB.`, err.issues, err.headers);
    throw badRequest("The form could not be read.", [{ path: "file", message: "a file field is required" }]);
  }
  const liftId = Number(form.get("liftId"));
  const file = form.get("file");
  const issues = [];
  if (!Number.isInteger(liftId) || liftId <= 0) issues.push({ path: "liftId", message: "a lift id is required" });
  if (!(file instanceof File)) issues.push({ path: "file", message: "a file field is required" });
  if (issues.length) throw badRequest("The upload has invalid fields.", issues);
  const f = file as File;
  const bytes = Buffer.from(await f.arrayBuffer());
  return NextResponse.json(await storePhoto(actor, liftId, { name: f.name, bytes }), { status: 201 });
});
