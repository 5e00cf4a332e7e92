import { PutObjectCommand } from "@aws-sdk/client-s3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getCaptureDetail } from "@/db/queries/captures";
import { getEnv } from "@/lib/server/env";
import { getS3 } from "@/lib/server/storage";
import { getCurrentAnalysis, listAnalysisHistory } from "@/db/queries/analyses";
import { getUnit } from "@/db/queries/units";
import { HttpError } from "@/lib/auth/guards";
import { requestReanalysis } from "@/lib/dal/reanalysis";
import { makeBrokenCsv, makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, completeViaApi, demoActor, demoLabStation, registerViaApi, startWorker, type WorkerProcess, unitId, uploadViaApi, waitForState } from "./pipeline-support";

let worker: WorkerProcess;
let labId: string;
let token: string;
const run = Date.now();

beforeAll(async () => {
  ({ labId, token } = await demoLabStation());
  worker = await startWorker();
});

afterAll(async () => {
  await worker?.stop();
  await closeConnections();
});

describe("bench API upload → queue → worker → PostgreSQL", () => {
  it("uploadViaApi(a clean 400 V capture) ends analysed with report, columns, preview, spectrum and the unit's verdict", async () => {
    const csv = makeThreePhaseCsv({ variant: run % 1000 });
    const { id, completeStatus, complete } = await uploadViaApi(token, csv, { unitSerial: "KG45-260301", speedRpm: 1500 });
    expect(completeStatus).toBe(202);
    expect(complete.state).toBe("queued");
    const capture = await waitForState(labId, id, ["analysed", "rejected", "failed"]);
    expect(capture.state, capture.stateMessage ?? "").toBe("analysed");
    expect(capture.progress).toBe(100);
    const analysis = await getCurrentAnalysis({ kind: "lab", labId }, id);
    expect(analysis?.frequencyHz).toBeCloseTo(50, 3);
    expect(analysis?.vufPercent).toBeLessThan(0.1);
    expect(analysis?.worstThdPercent).toBeCloseTo(1, 1);
    const preview = analysis?.preview as { timeS: number[]; channels: { id: string; min: number[] }[] };
    expect(preview.channels.map((c) => c.id)).toEqual(["V_AN (V)", "V_BN (V)", "V_CN (V)"]);
    expect(preview.timeS.length).toBeGreaterThan(100);
    const spectrum = analysis?.spectrum as { channels: { orders: number[] }[] };
    expect(spectrum.channels[0]?.orders[0]).toBe(1);
    const unit = await getUnit({ kind: "lab", labId }, await unitId(labId, "KG45-260301"));
    expect(unit?.unit.latestOverall).toBe(analysis?.overall);
  });

  it("a CSV whose body turns non-numeric ends rejected with the engine's located message, never retried", async () => {
    const { id, completeStatus } = await uploadViaApi(token, makeBrokenCsv(run % 1000), { unitSerial: "KG45-260302" });
    expect(completeStatus).toBe(202);
    const capture = await waitForState(labId, id, ["analysed", "rejected", "failed"]);
    expect(capture.state).toBe("rejected");
    // Line 501 of the file: three preamble lines, the header, then data (index 500 of the lines).
    expect(capture.stateMessage).toMatch(/Not a number: "oops" \(line 501, column "V_BN \(V\)"\)/);
    expect(capture.attempts).toBe(1);
  });
});

describe("abuse of presigned upload URLs", () => {
  it("other bytes PUT through a capture's URL (same size) are refused by the store; written past the URL they end rejected by the sha256 check, never analysed", async () => {
    const declared = makeThreePhaseCsv({ variant: (run % 1000) + 7000 });
    const other = declared.replace("V_AN (V)", "V_XX (V)");
    const reg = await registerViaApi(token, declared, { unitSerial: "KG45-260302" });
    const upload = reg.body.upload;
    if (upload?.kind !== "single") throw new Error("expected a single-PUT plan");
    const swap = await fetch(upload.url, { method: "PUT", headers: upload.headers, body: other });
    expect([swap.status, /<Code>([^<]+)</.exec(await swap.text())?.[1]]).toEqual([400, "BadDigest"]);
    expect((await completeViaApi(token, reg.body.capture?.id ?? "")).status).toBe(409);
    // The worker's own check, for bytes that reach the key some other way (here: the app's credentials).
    const key = (await getCaptureDetail({ kind: "lab", labId }, reg.body.capture?.id ?? ""))!.capture.objectKey;
    await getS3().send(new PutObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key, Body: other, ContentLength: Buffer.byteLength(other) }));
    expect((await completeViaApi(token, reg.body.capture?.id ?? "")).status).toBe(202);
    const capture = await waitForState(labId, reg.body.capture?.id ?? "", ["analysed", "rejected", "failed"]);
    expect(capture.state).toBe("rejected");
    expect(capture.stateMessage).toMatch(/does not match the sha256/);
  });
});

describe("immutable raw objects", () => {
  it("an old upload URL cannot overwrite a completed capture (412); an object overwritten past it is refused on the next run, never analysed as the original", async () => {
    const csv = makeThreePhaseCsv({ variant: (run % 1000) + 8000 });
    const reg = await registerViaApi(token, csv, { unitSerial: "KG45-260303" });
    const upload = reg.body.upload;
    const id = reg.body.capture?.id ?? "";
    if (upload?.kind !== "single") throw new Error("expected a single-PUT plan");
    await fetch(upload.url, { method: "PUT", headers: upload.headers, body: csv });
    expect((await completeViaApi(token, id)).status).toBe(202);
    expect((await waitForState(labId, id, ["analysed", "rejected", "failed"])).state).toBe("analysed");
    const replaced = csv.replace("V_AN (V)", "V_XX (V)");
    expect((await fetch(upload.url, { method: "PUT", headers: upload.headers, body: replaced })).status).toBe(400);
    expect((await fetch(upload.url, { method: "PUT", headers: upload.headers, body: csv })).status).toBe(412);
    const key = (await getCaptureDetail({ kind: "lab", labId }, id))!.capture.objectKey;
    await getS3().send(new PutObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key, Body: replaced, ContentLength: Buffer.byteLength(replaced) }));
    await requestReanalysis(await demoActor("admin"), { captureId: id });
    const capture = await waitForState(labId, id, ["rejected", "failed"], 30_000);
    expect(capture.state).toBe("rejected");
    // The worker reads with If-Match on the recorded ETag (412 from the store), and checks the sha256:
    // either way the capture is rejected with an integrity message.
    expect(capture.stateMessage).toMatch(/changed after its upload was completed|does not match the sha256/);
  });
});

describe("requestReanalysis(actor, target)", () => {
  it("re-running an analysed capture keeps the earlier result in history and makes the new one current", async () => {
    const { id } = await uploadViaApi(token, makeThreePhaseCsv({ variant: (run % 1000) + 5000 }), { unitSerial: "KG45-260301" });
    await waitForState(labId, id, ["analysed"]);
    const admin = await demoActor("admin");
    const operator = await demoActor("operator");
    await expect(requestReanalysis(operator, { captureId: id })).rejects.toBeInstanceOf(HttpError);
    expect(await requestReanalysis(admin, { captureId: id })).toEqual({ queued: 1 });
    await waitForState(labId, id, ["analysed"]);
    const history = await listAnalysisHistory({ kind: "lab", labId }, id);
    expect(history).toHaveLength(2);
    expect(history.filter((h) => h.current)).toHaveLength(1);
    expect(history[0]?.current).toBe(true);
  });
});
