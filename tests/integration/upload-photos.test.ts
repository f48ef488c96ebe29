import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createEntry, listEntries } from "@/lib/logbook/service";
import { downloadHeaders, PHOTO_MAX_BYTES, readUpload, storePhoto } from "@/lib/logbook/uploads";
import { getModels } from "@/models";
import { closeDb, expectHttpError } from "./design-fixtures";
import { opsFakes, opsWorld } from "./logbook-fixtures";

let fakes: Awaited<ReturnType<typeof opsFakes>>;
let w: Awaited<ReturnType<typeof opsWorld>>;
let other: Awaited<ReturnType<typeof opsWorld>>;

// Source: PNG signature 89 50 4E 47 0D 0A 1A 0A (RFC 2083 §3.1); a valid 1 × 1 image.
const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==", "base64");

beforeAll(async () => {
  fakes = await opsFakes();
  w = await opsWorld("photo");
  other = await opsWorld("photo-other");
});
afterAll(async () => {
  await fakes.close();
  await closeDb();
});

describe("inspection photos", () => {
  it("stores an image under a generated key, attaches it to an inspection and serves it only to the organisation", async () => {
    const up = await storePhoto(w.as.operator, w.liftId, { name: "../crest.html", bytes: PNG });
    expect(up.contentType).toBe("image/png");
    const row = await getModels().Upload.findByPk(up.id);
    expect(row!.storageKey).toMatch(new RegExp(`^photos/${w.organisationId}/[0-9a-f-]{36}$`));
    await createEntry(w.as.operator, { kind: "inspection", liftId: w.liftId, findings: "Light rubbing on two side plates.", photoIds: [up.id] });
    const list = await listEntries(w.as.viewer, { liftId: String(w.liftId), kind: "inspection" });
    expect(list.items[0].photos.map((p) => p.id)).toEqual([up.id]);
    const got = await readUpload(w.as.viewer, up.id);
    expect(Buffer.compare(got.body, PNG)).toBe(0);
    expect(downloadHeaders(got.upload)["Content-Type"]).toBe("image/png");
    await expectHttpError(() => readUpload(other.as.admin, up.id), 404);
    // A photo attaches once, and never to another organisation's entry.
    await expectHttpError(() => createEntry(w.as.operator, { kind: "inspection", liftId: w.liftId, findings: "again", photoIds: [up.id] }), 400);
  });

  it("refuses HTML dressed as a photo and an oversized file, storing nothing", async () => {
    const { Upload } = getModels();
    const n = await Upload.count({ where: { organisationId: w.organisationId } });
    const err = await expectHttpError(() => storePhoto(w.as.operator, w.liftId, { name: "photo.jpg", bytes: Buffer.from("<html><script>alert(1)</script></html>") }), 400);
    expect(err.issues[0].path).toBe("file");
    const big = Buffer.concat([PNG, Buffer.alloc(PHOTO_MAX_BYTES)]);
    await expectHttpError(() => storePhoto(w.as.operator, w.liftId, { name: "big.png", bytes: big }), 413);
    await expectHttpError(() => storePhoto(w.as.viewer, w.liftId, { name: "x.png", bytes: PNG }), 403);
    await expectHttpError(() => storePhoto(other.as.operator, w.liftId, { name: "x.png", bytes: PNG }), 404);
    expect(await Upload.count({ where: { organisationId: w.organisationId } })).toBe(n);
  });
});
