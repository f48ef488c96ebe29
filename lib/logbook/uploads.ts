/**
 * Inspection photos and logger files as received: checked (images by their bytes, size limit), stored
 * in object storage under a generated key, recorded in `uploads`, and read back only through our API for
 * a user of the same organisation.
 */
import crypto from "node:crypto";
import { assertCan, ownOr404, type Actor } from "@/lib/http/actor";
import { badRequest, HttpError } from "@/lib/http/errors";
import { clipText } from "@/lib/http/text";
import { deleteObject, getObject, newStorageKey, putObject } from "@/lib/storage/client";
import { sniffImage } from "@/lib/storage/sniff";
import { getModels, type Upload } from "@/models";

export const PHOTO_MAX_BYTES = Number(process.env.PHOTO_MAX_BYTES ?? 5 * 1024 * 1024);

export interface UploadView {
  id: number;
  kind: Upload["kind"];
  url: string;
  name: string;
  contentType: string;
  bytes: number;
}

export function uploadView(u: Upload): UploadView {
  return { id: u.id, kind: u.kind, url: `/api/uploads/${u.id}`, name: u.originalName, contentType: u.contentType, bytes: u.bytes };
}

/** A display name only (never used as a key or a path): no control characters, at most 200 characters. */
export function safeName(name: string): string {
  const s = name.replace(/[\u0000-\u001f\u007f"\\/]/g, "_").trim();
  return clipText(s || "file", 200);
}

export async function storePhoto(actor: Actor, liftId: number, file: { name: string; bytes: Buffer }): Promise<UploadView> {
  assertCan(actor, "logbook:write");
  const { Lift, Upload: UploadModel } = getModels();
  ownOr404(await Lift.findByPk(liftId), actor, "Lift");
  if (file.bytes.length === 0) throw badRequest("The file is empty.", [{ path: "file", message: "the file is empty" }]);
  if (file.bytes.length > PHOTO_MAX_BYTES)
    throw new HttpError(413, `The photo is larger than ${Math.round(PHOTO_MAX_BYTES / 1024 / 1024)} MiB.`, [{ path: "file", message: `at most ${PHOTO_MAX_BYTES} bytes` }]);
  const type = sniffImage(file.bytes);
  if (!type) throw badRequest("Only JPEG, PNG, GIF or WebP images can be attached.", [{ path: "file", message: "not a JPEG, PNG, GIF or WebP image (checked by its content)" }]);
  const key = newStorageKey("photos", actor.organisationId);
  await putObject(key, file.bytes, type.contentType);
  const row = await UploadModel.create({
    organisationId: actor.organisationId,
    liftId,
    kind: "photo",
    storageKey: key,
    originalName: safeName(file.name),
    contentType: type.contentType,
    bytes: file.bytes.length,
    sha256: crypto.createHash("sha256").update(file.bytes).digest("hex"),
    entryId: null,
    createdBy: actor.id,
  });
  return uploadView(row);
}

/** Stores a file as received for a recording (already validated by the caller). */
/** Removes a stored file and its row (a write that failed after the file was stored). */
export async function discardUpload(upload: Upload): Promise<void> {
  await upload.destroy();
  await deleteObject(upload.storageKey);
}

export async function storeRecordingFile(actor: Actor, liftId: number, name: string, bytes: Buffer): Promise<Upload> {
  const key = newStorageKey("recordings", actor.organisationId);
  await putObject(key, bytes, "text/csv");
  return getModels().Upload.create({
    organisationId: actor.organisationId,
    liftId,
    kind: "recording",
    storageKey: key,
    originalName: safeName(name),
    contentType: "text/csv",
    bytes: bytes.length,
    sha256: crypto.createHash("sha256").update(bytes).digest("hex"),
    entryId: null,
    createdBy: actor.id,
  });
}

/** The stored bytes of an upload of the actor's organisation (404 otherwise). */
export async function readUpload(actor: Actor, id: number): Promise<{ upload: Upload; body: Buffer }> {
  assertCan(actor, "logbook:read");
  const upload = ownOr404(await getModels().Upload.findByPk(id), actor, "File");
  return { upload, body: await getObject(upload.storageKey) };
}

/**
 * Headers for serving a stored file: the type we detected, never sniffed by the browser, never run as a
 * page (CSP sandbox), photos inline as images and everything else as a download.
 */
export function downloadHeaders(u: Pick<Upload, "id" | "kind" | "contentType" | "bytes">): Record<string, string> {
  const ext = u.contentType === "text/csv" ? "csv" : (u.contentType.split("/")[1] ?? "bin").replace("jpeg", "jpg");
  const disposition = u.kind === "photo" ? "inline" : "attachment";
  return {
    "Content-Type": u.kind === "photo" ? u.contentType : "text/csv; charset=utf-8",
    "Content-Length": String(u.bytes),
    "Content-Disposition": `${disposition}; filename="${u.kind}-${u.id}.${ext}"`,
    "X-Content-Type-Options": "nosniff",
    "Content-Security-Policy": "default-src 'none'; sandbox",
    "Cache-Control": "private, no-store",
  };
}
