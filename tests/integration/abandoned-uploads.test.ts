import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { getCaptureDetail } from "@/db/queries/captures";
import { captures } from "@/db/schema";
import { headObject } from "@/lib/server/storage";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { sweepAbandonedUploads } from "@/worker/abandoned-uploads";
import { closeConnections, completeViaApi, demoLabStation, putPartViaApi, registerViaApi, sha256 } from "./pipeline-support";

const DAY_MS = 24 * 3_600_000;
let labId: string;
let token: string;
const run = Date.now() % 100_000;

beforeAll(async () => {
  ({ labId, token } = await demoLabStation());
});
afterAll(closeConnections);

const lab = () => ({ kind: "lab" as const, labId });
const backdate = (id: string, ms: number) => getDb().update(captures).set({ updatedAt: new Date(Date.now() - ms) }).where(eq(captures.id, id));

describe("sweepAbandonedUploads", () => {
  it("removes uploads never completed after the limit (row, stored object), keeps recent ones, and the file can be sent again", async () => {
    // 1: the file was PUT but "complete" never came. 2: a multipart upload with one part sent.
    const csv = makeThreePhaseCsv({ variant: run });
    const single = await registerViaApi(token, csv, { unitSerial: "KG45-260306" });
    if (single.body.upload?.kind !== "single") throw new Error("expected a single-PUT plan");
    expect((await fetch(single.body.upload.url, { method: "PUT", headers: single.body.upload.headers, body: csv })).ok).toBe(true);
    const bigSize = 48 * 1024 ** 2;
    const multi = await registerViaApi(token, "x", { unitSerial: "KG45-260306", sizeBytes: bigSize, sha256: sha256(`big-${run}`) });
    if (multi.body.upload?.kind !== "multipart") throw new Error("expected a multipart plan");
    expect((await putPartViaApi(token, multi.body.capture?.id ?? "", 1, Buffer.alloc(multi.body.upload.partSize, 65))).etag).not.toBe("");
    const recent = await registerViaApi(token, makeThreePhaseCsv({ variant: run + 1 }), { unitSerial: "KG45-260306" });
    const ids = [single, multi, recent].map((r) => r.body.capture?.id ?? "");
    const [singleId = "", multiId = "", recentId = ""] = ids;
    const singleKey = (await getCaptureDetail(lab(), singleId))?.capture.objectKey ?? "";
    expect(await headObject(singleKey)).not.toBeNull();

    await backdate(singleId, DAY_MS + 60_000);
    await backdate(multiId, DAY_MS + 60_000);
    await backdate(recentId, DAY_MS - 60_000);
    const result = await sweepAbandonedUploads(DAY_MS);

    expect(result.removed).toBeGreaterThanOrEqual(2);
    expect(result.storageErrors).toEqual([]);
    expect(await getCaptureDetail(lab(), singleId)).toBeUndefined();
    expect(await getCaptureDetail(lab(), multiId)).toBeUndefined();
    expect((await getCaptureDetail(lab(), recentId))?.capture.state).toBe("uploading");
    expect(await headObject(singleKey)).toBeNull();
    // Completing the removed upload now answers 404; re-sending the same file starts a new capture.
    expect((await completeViaApi(token, singleId)).status).toBe(404);
    const again = await registerViaApi(token, csv, { unitSerial: "KG45-260306" });
    expect(again.status).toBe(201);
    expect(again.body.duplicate).toBe(false);
    expect(again.body.capture?.id).not.toBe(singleId);
  });

  it("leaves analysed, queued and rejected captures alone however old they are", async () => {
    const settled = (await getDb().select({ id: captures.id, state: captures.state }).from(captures).where(eq(captures.labId, labId)))
      .filter((c) => c.state !== "uploading");
    expect(settled.length).toBeGreaterThan(0);
    for (const c of settled) await backdate(c.id, 2 * DAY_MS);
    await sweepAbandonedUploads(DAY_MS);
    const left = new Set((await getDb().select({ id: captures.id }).from(captures).where(eq(captures.labId, labId))).map((c) => c.id));
    for (const c of settled) expect(left.has(c.id), `${c.state} capture ${c.id}`).toBe(true);
  });
});
