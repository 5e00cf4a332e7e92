import { eq, sql } from "drizzle-orm";
import { PutObjectCommand } from "@aws-sdk/client-s3";
import { getEnv } from "@/lib/server/env";
import { getS3 } from "@/lib/server/storage";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/client";
import { getCaptureDetail } from "@/db/queries/captures";
import { getUnitBySerial } from "@/db/queries/units";
import { captures } from "@/db/schema";
import { POST as registerRoute } from "@/app/api/v1/captures/route";
import { UPLOAD_LEASE_S } from "@/lib/dal/capture-intake";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, completeViaApi, demoLabStation, registerViaApi, sha256, uploadViaApi, waitForState } from "./pipeline-support";

// Races and dead ends of capture intake: every path leaves either a good capture or nothing, and
// the same good file can always be sent (again).

const storageFaults = vi.hoisted(() => ({ failCreateMultipart: false }));
vi.mock("@/lib/server/storage", async (importOriginal) => {
  const original = await importOriginal<typeof import("@/lib/server/storage")>();
  return {
    ...original,
    createMultipartUpload: async (key: string) => {
      if (storageFaults.failCreateMultipart) throw Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:46012"), { code: "ECONNREFUSED", $metadata: {} });
      return original.createMultipartUpload(key);
    },
  };
});

let labId: string;
let token: string;
const run = Date.now() % 1_000_000;
const capturesWithSha = (hash: string) => getDb().select({ id: captures.id }).from(captures).where(eq(captures.sha256, hash));

beforeAll(async () => {
  ({ labId, token } = await demoLabStation());
});
afterAll(closeConnections);

describe("capture intake under races", () => {
  it("registerCapture for 20 concurrent registrations of one file for a new serial: one upload, 19 × 409 'in progress' with Retry-After, and the one upload completes", async () => {
    const unitSerial = `RACE-${run}`;
    const ratingId = (await getUnitBySerial({ kind: "lab", labId }, "KG45-260301"))?.rating.id;
    const csv = makeThreePhaseCsv({ variant: run + 100 });
    const body = JSON.stringify({ unitSerial, newUnitRatingId: ratingId, confirmNewUnit: true, testKind: "no-load", fileName: "race.csv", sizeBytes: Buffer.byteLength(csv), sha256: sha256(csv) });
    const answers = await Promise.all(Array.from({ length: 20 }, () =>
      registerRoute(new Request("http://test/api/v1/captures", { method: "POST", headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json" }, body }))));
    const statuses = answers.map((a) => a.status).sort();
    expect(statuses.filter((s) => s === 201)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(19);
    for (const busy of answers.filter((a) => a.status === 409)) {
      expect(Number(busy.headers.get("Retry-After"))).toBeGreaterThan(0);
      expect(Number(busy.headers.get("Retry-After"))).toBeLessThanOrEqual(UPLOAD_LEASE_S);
      expect(((await busy.json()) as { error: string }).error).toMatch(/in progress/);
    }
    const winner = (await answers.find((a) => a.status === 201)?.json()) as { capture: { id: string }; upload: { kind: "single"; url: string; headers: Record<string, string> } };
    expect(winner.upload.kind).toBe("single");
    const put = await fetch(winner.upload.url, { method: "PUT", headers: winner.upload.headers, body: csv });
    expect(put.ok).toBe(true);
    expect((await completeViaApi(token, winner.capture.id)).status).toBe(202);
    expect(await capturesWithSha(sha256(csv))).toHaveLength(1);
    expect((await waitForState(labId, winner.capture.id, ["queued", "analysing", "analysed"], 5_000)).state).not.toBe("rejected");
  });

  it("registerCapture for an upload idle longer than the lease takes it over with fresh URLs (a crashed client's retry)", async () => {
    const csv = makeThreePhaseCsv({ variant: run + 101 });
    const first = await registerViaApi(token, csv, { unitSerial: "KG45-260309" });
    expect(first.status).toBe(201);
    const id = first.body.capture?.id ?? "";
    await getDb().update(captures).set({ updatedAt: sql`now() - interval '${sql.raw(String(UPLOAD_LEASE_S + 5))} seconds'` }).where(eq(captures.id, id));
    const retry = await registerViaApi(token, csv, { unitSerial: "KG45-260309" });
    expect(retry.status).toBe(200);
    expect(retry.body.capture?.id).toBe(id);
    expect(retry.body.upload?.kind).toBe("single");
  });

  it("completeCaptureUpload with a size mismatch: 400, nothing kept, and the honest retry registers again at once", async () => {
    const csv = makeThreePhaseCsv({ variant: run + 102 });
    const lie = await registerViaApi(token, csv, { unitSerial: "KG45-260309", sizeBytes: Buffer.byteLength(csv) + 10 });
    expect(lie.status).toBe(201);
    const upload = lie.body.upload;
    if (upload?.kind !== "single") throw new Error("expected a single PUT");
    // The URL is signed for the declared length: the store refuses the shorter file...
    expect((await fetch(upload.url, { method: "PUT", headers: upload.headers, body: csv })).status).toBe(403);
    // ...and completion checks the size of whatever reached the key some other way.
    const key = (await getCaptureDetail({ kind: "lab", labId }, lie.body.capture?.id ?? ""))!.capture.objectKey;
    await getS3().send(new PutObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key, Body: csv, ContentLength: Buffer.byteLength(csv) }));
    const done = await completeViaApi(token, lie.body.capture?.id ?? "");
    expect(done.status).toBe(400);
    expect(done.body.error).toMatch(/bytes.*register the file again/);
    expect(await getCaptureDetail({ kind: "lab", labId }, lie.body.capture?.id ?? "")).toBeUndefined();
    const honest = await uploadViaApi(token, csv, { unitSerial: "KG45-260309" });
    expect(honest.register.status).toBe(201);
    expect(honest.completeStatus).toBe(202);
  });

  it("registerCapture with the object store unreachable while starting a multipart upload: 503 in a sentence, Retry-After, and no row left", async () => {
    const csv = makeThreePhaseCsv({ variant: run + 103 });
    storageFaults.failCreateMultipart = true;
    try {
      // Over the multipart threshold (32 MiB) by its declared size; nothing is uploaded.
      const reg = await registerRoute(new Request("http://test/api/v1/captures", {
        method: "POST", headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json" },
        body: JSON.stringify({ unitSerial: "KG45-260309", testKind: "no-load", fileName: "big.csv", sizeBytes: 40 * 1024 ** 2, sha256: sha256(csv) }),
      }));
      expect(reg.status).toBe(503);
      expect(reg.headers.get("Retry-After")).toBe("30");
      const body = (await reg.json()) as { error: string };
      expect(body.error).toBe("The file store was unreachable; please try again in a minute.");
      expect(await capturesWithSha(sha256(csv))).toHaveLength(0);
    } finally {
      storageFaults.failCreateMultipart = false;
    }
  });
});
