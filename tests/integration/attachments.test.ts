import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/db/queries/connection";
import { listUnitEvents } from "@/db/queries/unit-events";
import { getUnitBySerial } from "@/db/queries/units";
import type { SessionUser } from "@/lib/auth/options";
import { HttpError } from "@/lib/auth/guards";
import { findAttachmentFor, listAttachmentsFor, removeAttachmentAs } from "@/lib/dal/attachments";
import { getEnv } from "@/lib/server/env";
import { fetchStoredFile, getUtApi } from "@/lib/server/uploadthing";
import { makePng } from "@/tests/fixtures/attachments/make-png";
import { seededOrgs } from "./helpers";
import { sessionUser, putFile, requestUpload, startUploadRoute, uploadPng, type UploadRoute } from "./attachments-support";
import { createOtherLab } from "./pipeline-support";
import { POST as uploadthingPost } from "@/app/api/uploadthing/route";
import { NextRequest } from "next/server";

// Against the uploadthing fake the test command starts: uploadthing's server SDK (route handler and
// UTApi) with the app's file router, the fake's signature checks, and scope on every read.

const SERIAL = "KS8-261108"; // a Kestrum unit the lab tests
const run = Date.now() % 1_000_000;
const md5 = (b: Buffer) => createHash("md5").update(b).digest("hex");

let prod: UploadRoute;
let dev: UploadRoute;
let unitId: string;
let operator: SessionUser, qa: SessionUser, kestrum: SessionUser, poldane: SessionUser, otherLab: SessionUser;

beforeAll(async () => {
  const { lab } = await seededOrgs();
  const unit = await getUnitBySerial({ kind: "lab", labId: lab.id }, SERIAL);
  if (!unit) throw new Error(`no seeded unit ${SERIAL}`);
  unitId = unit.unit.id;
  [operator, qa, kestrum, poldane] = await Promise.all([
    sessionUser("tobiah.crane@harrowgate.example"), sessionUser("ines.vardy@harrowgate.example"),
    sessionUser("ruan.petit@kestrum.example"), sessionUser("sela.ambrose@poldane.example"),
  ]);
  otherLab = (await createOtherLab(`att${run}`)).sessionUser;
  [prod, dev] = await Promise.all([startUploadRoute({ isDev: false }), startUploadRoute({ isDev: true })]);
});

afterAll(async () => {
  await Promise.all([prod?.close(), dev?.close()]);
  await closeDb();
});

describe("uploading through uploadthing's route handler to the fake", () => {
  it("presigned PUT → signed callback → onUploadComplete writes the row; the stored bytes come back through UTApi", async () => {
    prod.as(operator);
    const png = makePng(run % 200);
    const up = await uploadPng(prod, png, `nameplate-${run}.png`, { unitId, kind: "nameplate", caption: "Stator frame plate" });
    expect(up.fileHash).toBe(md5(png));
    const rows = await listAttachmentsFor(operator, unitId);
    const row = rows.find((r) => r.id === up.attachmentId);
    expect(row).toMatchObject({ kind: "nameplate", caption: "Stator frame plate", originalName: `nameplate-${run}.png`, contentType: "image/png", sizeBytes: png.length, uploadedBy: "Tobiah Crane" });
    const stored = await fetchStoredFile(up.key);
    expect(Buffer.from(await (stored as Response).arrayBuffer()).equals(png)).toBe(true);
  });

  it("in development mode the callback travels over the route-metadata stream and still writes the row", async () => {
    dev.as(operator);
    const png = makePng((run + 1) % 200);
    const up = await uploadPng(dev, png, `scope-${run}.png`, { unitId, kind: "scope-screen" });
    expect((await findAttachmentFor(operator, up.attachmentId))?.fileKey).toBe(up.key);
  });

  it("the middleware refuses other organisations, clients and files outside the rules, naming file and limit", async () => {
    const png = { name: "plate.png", type: "image/png", size: 1000 };
    prod.as(otherLab);
    expect(await requestUpload(prod, [png], { unitId, kind: "other" })).toMatchObject({ status: 404, error: "No such unit." });
    prod.as(kestrum);
    expect((await requestUpload(prod, [png], { unitId, kind: "other" })).status).toBe(403);
    prod.as(null);
    expect((await requestUpload(prod, [png], { unitId, kind: "other" })).status).toBe(403);
    prod.as(operator);
    const gif = await requestUpload(prod, [{ name: "bench.gif", type: "image/gif", size: 1000 }], { unitId, kind: "set-up" });
    expect(gif.status).toBe(400);
    expect(gif.error).toMatch(/“bench\.gif” is not a PNG, JPEG, WebP or PDF file/);
    const big = await requestUpload(prod, [{ name: "cert.pdf", type: "application/pdf", size: 17 * 1024 * 1024 }], { unitId, kind: "certificate" });
    expect(big.error).toMatch(/“cert\.pdf” is 17 MB; the limit is 16 MB per file/);
    const many = await requestUpload(prod, Array.from({ length: 11 }, (_, i) => ({ ...png, name: `p${i}.png` })), { unitId, kind: "other" });
    expect(many.error).toMatch(/at most 10 files at once \(you picked 11\)/);
    expect((await requestUpload(prod, [png], { unitId, kind: "selfie" as "other" })).status).toBe(400);
  });

  it("the fake refuses a presigned URL that was altered, a private file without a signed URL, and the app refuses a forged callback", async () => {
    prod.as(operator);
    const png = makePng((run + 2) % 200);
    const asked = await requestUpload(prod, [{ name: "tamper.png", type: "image/png", size: png.length }], { unitId, kind: "other" });
    const url = new URL(asked.presigned[0]?.url ?? "");
    url.searchParams.set("x-ut-file-size", String(png.length * 10));
    expect((await putFile(url.toString(), png, "tamper.png", "image/png")).status).toBe(403);

    const up = await uploadPng(prod, png, `private-${run}.png`, { unitId, kind: "other" });
    const appId = JSON.parse(Buffer.from(getEnv().UPLOADTHING_TOKEN ?? "", "base64").toString()).appId as string;
    const bare = await fetch(`${getEnv().UPLOADTHING_INGEST_URL}/a/${appId}/${up.key}`);
    expect(bare.status).toBe(403);
    const { ufsUrl } = await getUtApi().generateSignedURL(up.key);
    expect((await fetch(ufsUrl.replace(/.$/, (c) => (c === "0" ? "1" : "0")))).status).toBe(403);

    const forged = await fetch(`${prod.base}/api/uploadthing?slug=unitAttachment`, {
      method: "POST",
      headers: { "content-type": "application/json", "uploadthing-hook": "callback", "x-uploadthing-signature": `hmac-sha256=${"0".repeat(64)}` },
      body: JSON.stringify({ status: "uploaded", origin: "http://127.0.0.1:1", metadata: { unitId }, file: {} }),
    });
    expect(forged.status).toBe(400);
  });
});

describe("POST /api/uploadthing", () => {
  it("refuses a body over 64 KiB with 413 before uploadthing's handler reads it, declared or not", async () => {
    const big = JSON.stringify({ files: [{ name: "x".repeat(70 * 1024), size: 1, type: "image/png" }] });
    const url = "http://127.0.0.1/api/uploadthing?actionType=upload&slug=unitAttachment";
    const declared = await uploadthingPost(new NextRequest(url, { method: "POST", headers: { "content-type": "application/json" }, body: big }));
    expect(declared.status).toBe(413);
    const stream = new ReadableStream<Uint8Array>({ start: (c) => { c.enqueue(new TextEncoder().encode(big)); c.close(); } });
    const undeclared = await uploadthingPost(new NextRequest(url, { method: "POST", headers: { "content-type": "application/json" }, body: stream, duplex: "half" } as unknown as ConstructorParameters<typeof NextRequest>[1]));
    expect(undeclared.status).toBe(413);
  });
});

describe("reading and removing attachments under a Scope", () => {
  it("the owning client reads its unit's attachments; another client and another lab see nothing", async () => {
    prod.as(operator);
    const up = await uploadPng(prod, makePng((run + 3) % 200), `setup-${run}.png`, { unitId, kind: "set-up" });
    expect((await listAttachmentsFor(kestrum, unitId)).some((r) => r.id === up.attachmentId)).toBe(true);
    expect((await findAttachmentFor(kestrum, up.attachmentId))?.id).toBe(up.attachmentId);
    expect(await listAttachmentsFor(poldane, unitId)).toEqual([]);
    expect(await findAttachmentFor(poldane, up.attachmentId)).toBeNull();
    expect(await findAttachmentFor(otherLab, up.attachmentId)).toBeNull();
    expect(await findAttachmentFor(kestrum, "not-a-uuid")).toBeNull();
  });

  it("removeAttachmentAs: operators and clients may not; QA removes row and stored file and leaves an event in the unit history", async () => {
    prod.as(operator);
    const name = `sheet-${run}.png`;
    const up = await uploadPng(prod, makePng((run + 4) % 200), name, { unitId, kind: "certificate" });
    await expect(removeAttachmentAs(operator, up.attachmentId)).rejects.toBeInstanceOf(HttpError);
    await expect(removeAttachmentAs(kestrum, up.attachmentId)).rejects.toBeInstanceOf(HttpError);
    expect(await removeAttachmentAs({ ...otherLab, role: "qa" }, up.attachmentId)).toBeNull();
    expect((await removeAttachmentAs(qa, up.attachmentId))?.fileKey).toBe(up.key);
    expect(await findAttachmentFor(qa, up.attachmentId)).toBeNull();
    expect(await fetchStoredFile(up.key)).toBeNull();
    const events = await listUnitEvents({ kind: "lab", labId: qa.organisationId }, unitId);
    expect(events.find((e) => e.kind === "attachment-removed" && e.comment.includes(name))?.actor).toBe("Ines Vardy");
    expect(await removeAttachmentAs(qa, up.attachmentId)).toBeNull();
  });
});
