import { createHash } from "node:crypto";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getCurrentAnalysis } from "@/db/queries/analyses";
import { readCaptureFile } from "@/lib/server/capture-reader";
import { PARALLEL_MIN_BYTES } from "@/lib/server/parallel-ingest";
import { headObject } from "@/lib/server/storage";
import { readStoredCapture } from "@/lib/server/stored-capture";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, demoLabStation, startWorker, type WorkerProcess, uploadViaApi, waitForState } from "./pipeline-support";

// A capture above the parallel threshold through the real store and worker: it comes down with
// ranged GETs into the two-thread ingestion, its sha256 is checked over the whole object, and its
// figures equal the engine's on the same bytes from local disk.

let worker: WorkerProcess;
let labId: string;
let token: string;
const dir = mkdtempSync(path.join(tmpdir(), "large-capture-"));
// 2 M rows of about 37.5 bytes: some 75 MB, over the 64 MiB threshold.
const csv = makeThreePhaseCsv({ sampleRateHz: 50_000, cycles: 2000, variant: Date.now() % 100_000 });
const file = path.join(dir, "large.csv");
let captureId = "";
let objectKey = "";

beforeAll(async () => {
  expect(Buffer.byteLength(csv)).toBeGreaterThan(PARALLEL_MIN_BYTES);
  writeFileSync(file, csv);
  ({ labId, token } = await demoLabStation());
  worker = await startWorker();
}, 60_000);

afterAll(async () => {
  await worker?.stop();
  await closeConnections();
  rmSync(dir, { recursive: true, force: true });
});

describe("a large capture through ranged GETs", () => {
  it("ends analysed with the figures of the engine on the local file", async () => {
    const { id, completeStatus, register } = await uploadViaApi(token, csv, { unitSerial: "KG45-260301", speedRpm: 1500 });
    expect(register.body.upload?.kind).toBe("multipart");
    expect(completeStatus).toBe(202);
    captureId = id;
    const capture = await waitForState(labId, id, ["analysed", "rejected", "failed"], 180_000);
    expect(capture.state, capture.stateMessage ?? "").toBe("analysed");
    objectKey = capture.objectKey;
    const analysis = await getCurrentAnalysis({ kind: "lab", labId }, id);
    const local = await readCaptureFile(file);
    // Closed form for the generator's signal: 50 Hz, 230.94 V fundamental with 1 % fifth (common practice).
    expect(analysis?.frequencyHz).toBeCloseTo(50, 6);
    const report = analysis?.report as { sampleCount: number; channels: { rms: number }[] };
    expect(report.sampleCount).toBe(local.sampleCount);
    const rmsLocal = Math.sqrt(local.channels[0]!.samples.reduce((s, v) => s + v * v, 0) / local.sampleCount);
    expect(report.channels[0]?.rms).toBeCloseTo(rmsLocal, 6);
    expect(report.channels[0]?.rms).toBeCloseTo(230.94 * Math.sqrt(1 + 0.01 ** 2), 2);
  }, 240_000);

  it("readStoredCapture takes the ranged path and hashes the whole object", async () => {
    expect(objectKey).not.toBe("");
    const stored = await headObject(objectKey);
    let last = 0;
    const read = await readStoredCapture({ objectKey, objectEtag: stored!.etag, sizeBytes: Buffer.byteLength(csv) }, {}, (share) => (last = share));
    expect(read.path).toBe("ranged");
    expect(read.sha256).toBe(createHash("sha256").update(csv).digest("hex"));
    expect(read.bytes).toBe(Buffer.byteLength(csv));
    expect(read.parsed?.sampleCount).toBe(2_000_000);
    expect(last).toBe(1);
  }, 120_000);

  it("an object changed since completion (another ETag) fails with 412, and another size is a mismatch before any range", async () => {
    const size = Buffer.byteLength(csv);
    await expect(readStoredCapture({ objectKey, objectEtag: '"00000000000000000000000000000000"', sizeBytes: size }, {}, () => {}))
      .rejects.toMatchObject({ $metadata: { httpStatusCode: 412 } });
    const other = await readStoredCapture({ objectKey, objectEtag: null, sizeBytes: size + 1 }, {}, () => {});
    expect([other.parsed, other.bytes, other.sha256]).toEqual([null, size, ""]);
    expect(captureId).not.toBe("");
  }, 120_000);
});
