import { createHash, randomBytes } from "node:crypto";
import { GetObjectCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getCaptureDownloadUrl } from "@/lib/dal/captures";
import { getEnv } from "@/lib/server/env";
import { createMultipartUpload, getS3, headObject, presignParts, presignSinglePut, sha256Base64 } from "@/lib/server/storage";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, demoActor, demoLabStation, partUrlViaApi, putPartViaApi, registerViaApi, completeViaApi, uploadViaApi } from "./pipeline-support";

// Uploads that cannot be swapped, against the real local store (scripts/services: the signature-
// checking gate in front of s3rver): presigned URLs bind length and sha256, a completed upload's
// URLs are no longer honoured, a later write is detected at download; the store refuses unsigned
// and wrongly signed requests and answers CORS for the app's origin only.

let token: string;
const run = `${Date.now()}-${randomBytes(3).toString("hex")}`;
const hex = (b: Buffer | string) => createHash("sha256").update(b).digest("hex");
const codeOf = async (res: Response) => /<Code>([^<]+)<\/Code>/.exec(await res.text())?.[1] ?? `HTTP ${res.status}`;

beforeAll(async () => {
  ({ token } = await demoLabStation());
});
afterAll(closeConnections);

describe("presigned upload URLs against the local store", () => {
  it("presignSinglePut: other bytes of the same length are refused (BadDigest), the registered bytes are stored, and a second PUT is refused (412)", async () => {
    const key = `tests/${run}/single.csv`;
    const good = Buffer.from(`t,u\n0,1\n${run}\n`);
    const swapped = Buffer.from(good.toString().replace("0,1", "0,9"));
    const { url, headers } = await presignSinglePut(key, good.length, hex(good));
    const swap = await fetch(url, { method: "PUT", headers, body: swapped });
    expect([swap.status, await codeOf(swap)]).toEqual([400, "BadDigest"]);
    expect(await headObject(key)).toBeNull();
    // A sender that drops the bound checksum header breaks the signature instead.
    const { "x-amz-checksum-sha256": _c, ...unbound } = headers;
    const bare = await fetch(url, { method: "PUT", headers: unbound, body: swapped });
    expect([bare.status, await codeOf(bare)]).toEqual([403, "SignatureDoesNotMatch"]);
    const longer = await fetch(url, { method: "PUT", headers, body: Buffer.concat([good, Buffer.from("x")]) });
    expect([longer.status, await codeOf(longer)]).toEqual([403, "SignatureDoesNotMatch"]);
    const put = await fetch(url, { method: "PUT", headers, body: good });
    expect(put.status).toBe(200);
    const again = await fetch(url, { method: "PUT", headers, body: good });
    expect([again.status, await codeOf(again)]).toEqual([412, "PreconditionFailed"]);
    const stored = await getS3().send(new GetObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key }));
    expect(hex(Buffer.from(await stored.Body!.transformToByteArray()))).toBe(hex(good));
  });

  it("presignParts: a part URL refuses bytes other than the part it was issued for, and a part of another length", async () => {
    const key = `tests/${run}/multi.csv`;
    const uploadId = await createMultipartUpload(key);
    const part = randomBytes(1024);
    const [issued] = await presignParts(key, uploadId, [{ partNumber: 1, sizeBytes: part.length, sha256Base64: sha256Base64(hex(part)) }]);
    if (!issued) throw new Error("no part URL");
    const other = Buffer.from(part);
    other[0] = (other[0]! + 1) % 256;
    const swap = await fetch(issued.url, { method: "PUT", headers: issued.headers, body: other });
    expect([swap.status, await codeOf(swap)]).toEqual([400, "BadDigest"]);
    const short = await fetch(issued.url, { method: "PUT", headers: issued.headers, body: part.subarray(1) });
    expect([short.status, await codeOf(short)]).toEqual([403, "SignatureDoesNotMatch"]);
    expect((await fetch(issued.url, { method: "PUT", headers: issued.headers, body: part })).status).toBe(200);
  });

  it("a completed multipart capture's part URLs are no longer honoured (NoSuchUpload)", async () => {
    const size = 33 * 1024 ** 2;
    const bytes = randomBytes(size);
    const reg = await registerViaApi(token, "x", { unitSerial: "KG45-260306", sizeBytes: size, sha256: hex(bytes) });
    const id = reg.body.capture?.id ?? "";
    if (reg.body.upload?.kind !== "multipart") throw new Error(`expected a multipart plan: ${reg.status} ${reg.body.error}`);
    const { partSize, partCount } = reg.body.upload;
    const slice = (n: number) => bytes.subarray((n - 1) * partSize, n * partSize);
    const late = await partUrlViaApi(token, id, 1, slice(1));
    const parts = [];
    for (let n = 1; n <= partCount; n++) parts.push(await putPartViaApi(token, id, n, slice(n)));
    // The header check refuses random bytes, so completion answers 415/422; the parts were assembled either way.
    const done = await completeViaApi(token, id, parts);
    expect([415, 422]).toContain(done.status);
    const replay = await fetch(late.url, { method: "PUT", headers: late.headers, body: slice(1) });
    expect([replay.status, await codeOf(replay)]).toEqual([404, "NoSuchUpload"]);
  });

  it("getCaptureDownloadUrl serves the verified object and refuses (409) once the object under the key was replaced", async () => {
    const csv = makeThreePhaseCsv({ variant: Date.now() % 100_000 });
    const up = await uploadViaApi(token, csv, { unitSerial: "KG45-260306" });
    expect(up.completeStatus).toBe(202);
    const actor = await demoActor("qa");
    const url = await getCaptureDownloadUrl(actor, up.id);
    expect(hex(Buffer.from(await (await fetch(url)).arrayBuffer()))).toBe(hex(csv));
    // A write with the app's own credentials (no URL involved) still lands: the download detects it.
    const reg = up.register.body.capture!;
    const { getCaptureDetail } = await import("@/db/queries/captures");
    const key = (await getCaptureDetail(actor.scope, reg.id))!.capture.objectKey;
    const swapped = csv.replace(/\n[^\n]*\n$/, "\n");
    await getS3().send(new PutObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key, Body: swapped, ContentLength: Buffer.byteLength(swapped) }));
    await expect(getCaptureDownloadUrl(actor, up.id)).rejects.toMatchObject({ status: 409, message: expect.stringMatching(/not the one verified at upload/) });
  });
});

describe("the local store's access rules", () => {
  const endpoint = () => getEnv().S3_ENDPOINT;
  const objectUrl = () => `${endpoint()}/${getEnv().S3_BUCKET}/tests/${run}/single.csv`;

  it("an unsigned GET and an unsigned PUT are refused (403 AccessDenied)", async () => {
    const get = await fetch(objectUrl());
    expect([get.status, await codeOf(get)]).toEqual([403, "AccessDenied"]);
    const put = await fetch(`${endpoint()}/${getEnv().S3_BUCKET}/tests/${run}/anonymous.csv`, { method: "PUT", body: "a,b\n" });
    expect([put.status, await codeOf(put)]).toEqual([403, "AccessDenied"]);
    expect(await headObject(`tests/${run}/anonymous.csv`)).toBeNull();
  });

  it("a request signed with a wrong secret or an unknown access key is refused", async () => {
    const env = getEnv();
    const client = (accessKeyId: string, secretAccessKey: string) => new S3Client({
      endpoint: env.S3_ENDPOINT, region: env.S3_REGION, forcePathStyle: true, credentials: { accessKeyId, secretAccessKey },
      requestChecksumCalculation: "WHEN_REQUIRED", responseChecksumValidation: "WHEN_REQUIRED",
    });
    const put = (c: S3Client) => c.send(new PutObjectCommand({ Bucket: env.S3_BUCKET, Key: `tests/${run}/forged.csv`, Body: "a,b\n" }));
    await expect(put(client(env.S3_ACCESS_KEY_ID, `${env.S3_SECRET_ACCESS_KEY}0`))).rejects.toMatchObject({ name: "SignatureDoesNotMatch" });
    await expect(put(client("SOMEONE-ELSE", env.S3_SECRET_ACCESS_KEY))).rejects.toMatchObject({ name: "InvalidAccessKeyId" });
    expect(await headObject(`tests/${run}/forged.csv`)).toBeNull();
  });

  it("a CORS preflight from another origin is refused (403) and from the app's origin allowed with the ETag exposed", async () => {
    const preflight = (origin: string) => fetch(objectUrl(), {
      method: "OPTIONS", headers: { Origin: origin, "Access-Control-Request-Method": "PUT", "Access-Control-Request-Headers": "content-type,x-amz-checksum-sha256,if-none-match" },
    });
    const foreign = await preflight("http://elsewhere.example");
    expect(foreign.status).toBe(403);
    expect(foreign.headers.get("access-control-allow-origin")).toBeNull();
    const app = new URL(getEnv().NEXTAUTH_URL).origin;
    const own = await preflight(app);
    expect(own.status).toBe(200);
    expect(own.headers.get("access-control-allow-origin")).toBe(app);
    expect(own.headers.get("access-control-allow-headers")).toMatch(/x-amz-checksum-sha256/);
    expect(own.headers.get("access-control-expose-headers")).toMatch(/ETag/);
  });
});

describe("object reads from the local store (served by the gate from the store's files)", () => {
  const key = `tests/${run}/read-back.csv`;
  const body = Buffer.from(Array.from({ length: 5000 }, (_, i) => `${i},${(i * 0.37).toFixed(3)}`).join("\n") + "\n");
  const get = (input: Omit<ConstructorParameters<typeof GetObjectCommand>[0], "Bucket">) =>
    getS3().send(new GetObjectCommand({ Bucket: getEnv().S3_BUCKET, ...input }));

  beforeAll(async () => {
    await getS3().send(new PutObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key, Body: body }));
  });

  it("a whole GET and ranged GETs (start-end, open end, suffix) answer exactly those bytes", async () => {
    const whole = Buffer.from(await (await get({ Key: key })).Body!.transformToByteArray());
    expect(whole.equals(body)).toBe(true);
    for (const [range, expected] of [
      ["bytes=0-9", body.subarray(0, 10)],
      ["bytes=1000-1999", body.subarray(1000, 2000)],
      [`bytes=${body.length - 7}-`, body.subarray(body.length - 7)],
      ["bytes=-5", body.subarray(body.length - 5)],
      [`bytes=${body.length - 3}-${body.length + 100}`, body.subarray(body.length - 3)],
    ] as const) {
      const out = await get({ Key: key, Range: range });
      expect(Buffer.from(await out.Body!.transformToByteArray()).equals(expected), range).toBe(true);
      expect(out.ContentRange, range).toMatch(new RegExp(`/${body.length}$`));
    }
  });

  it("If-Match with the stored ETag reads, with another ETag answers 412; a range past the end answers 416", async () => {
    const stored = await headObject(key);
    expect(stored?.etag).toBe(`"${createHash("md5").update(body).digest("hex")}"`);
    await expect(get({ Key: key, IfMatch: stored!.etag, Range: "bytes=0-3" })).resolves.toMatchObject({ ContentLength: 4 });
    await expect(get({ Key: key, IfMatch: '"0123456789abcdef0123456789abcdef"' })).rejects.toMatchObject({ $metadata: { httpStatusCode: 412 } });
    await expect(get({ Key: key, Range: `bytes=${body.length}-` })).rejects.toMatchObject({ $metadata: { httpStatusCode: 416 } });
  });

  it("a missing key still answers NoSuchKey, and a presigned GET with response overrides names the file", async () => {
    await expect(get({ Key: `tests/${run}/absent.csv` })).rejects.toMatchObject({ name: "NoSuchKey" });
    const { getSignedUrl } = await import("@aws-sdk/s3-request-presigner");
    const url = await getSignedUrl(getS3(), new GetObjectCommand({
      Bucket: getEnv().S3_BUCKET, Key: key, ResponseContentDisposition: 'attachment; filename="a.csv"', ResponseContentType: "text/csv",
    }), { expiresIn: 60 });
    const res = await fetch(url);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-disposition")).toBe('attachment; filename="a.csv"');
    expect(res.headers.get("content-type")).toBe("text/csv");
    expect(Buffer.from(await res.arrayBuffer()).equals(body)).toBe(true);
    const tampered = await fetch(url.replace("response-content-type=text%2Fcsv", "response-content-type=text%2Fhtml"));
    expect(tampered.status).toBe(403);
  });
});
