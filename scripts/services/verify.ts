/**
 * End-to-end check of the local services (bash scripts/services.sh verify):
 * PostgreSQL login as emfolio on both databases, Redis PING, an S3 stream
 * round trip (PutObject and a multipart Upload), a presigned PUT with curl, the
 * CORS preflight a browser sends, a test mail through the SMTP fake, and a round trip through the
 * uploadthing fake with uploadthing's own UTApi (upload, signed read, unsigned read refused, delete).
 * Exits non-zero on the first failure.
 */
import { createHash, randomBytes } from "node:crypto";
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import { fileURLToPath } from "node:url";
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  PutObjectCommand,
  S3Client,
} from "@aws-sdk/client-s3";
import { Upload } from "@aws-sdk/lib-storage";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { Redis } from "ioredis";
import nodemailer from "nodemailer";
import pg from "pg";
import { UTApi, UTFile } from "uploadthing/server";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
const PG_PORT = Number(process.env.EMFOLIO_PG_PORT ?? 54329);
const REDIS_PORT = Number(process.env.EMFOLIO_REDIS_PORT ?? 63799);
const S3_PORT = Number(process.env.EMFOLIO_S3_PORT ?? 45690);
const SMTP_PORT = Number(process.env.EMFOLIO_SMTP_PORT ?? 2529);
const UT_PORT = Number(process.env.EMFOLIO_UPLOADTHING_PORT ?? 45700);
const ENDPOINT = `http://127.0.0.1:${S3_PORT}`;
const DATA_DIR = process.env.EMFOLIO_DATA_DIR ?? path.join(root, ".data");
const MAIL_DIR = path.join(DATA_DIR, "mail");
const S3_SECRET = readFileSync(path.join(DATA_DIR, "s3-secret"), "utf8").trim();
const SMTP_SECRET = readFileSync(path.join(DATA_DIR, "smtp-secret"), "utf8").trim();

function ok(msg: string): void {
  console.log(`ok   ${msg}`);
}

function sha256(b: Buffer): string {
  return createHash("sha256").update(b).digest("hex");
}

async function bodyBytes(body: unknown): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of body as AsyncIterable<Uint8Array>) chunks.push(Buffer.from(c));
  return Buffer.concat(chunks);
}

function curl(args: string[]): string {
  return execFileSync("curl", ["-sS", "--max-time", "20", ...args], { encoding: "utf8" });
}

async function checkPostgres(): Promise<void> {
  for (const database of ["emfolio", "emfolio_test"]) {
    const client = new pg.Client({ host: "127.0.0.1", port: PG_PORT, user: "emfolio", password: "emfolio", database });
    await client.connect();
    const r = await client.query<{ db: string; owner: string }>(
      "SELECT current_database() AS db, pg_get_userbyid(datdba) AS owner FROM pg_database WHERE datname = current_database()",
    );
    await client.end();
    if (r.rows[0]?.owner !== "emfolio") throw new Error(`database ${database} is not owned by emfolio`);
    ok(`postgres: emfolio/emfolio logs into ${database} (owner emfolio)`);
  }
}

async function checkRedis(): Promise<void> {
  const redis = new Redis({ host: "127.0.0.1", port: REDIS_PORT, db: 1, lazyConnect: true, maxRetriesPerRequest: 1 });
  await redis.connect();
  const pong = await redis.ping();
  const aof = (await redis.config("GET", "appendonly")) as string[];
  await redis.quit();
  if (pong !== "PONG") throw new Error(`redis answered ${pong}`);
  if (aof[1] !== "yes") throw new Error("redis appendonly is not enabled");
  ok("redis: PING on db 1, appendonly yes");
}

async function checkS3(): Promise<void> {
  const s3 = new S3Client({
    endpoint: ENDPOINT,
    region: "us-east-1",
    forcePathStyle: true,
    credentials: { accessKeyId: "S3RVER", secretAccessKey: S3_SECRET },
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
  for (const Bucket of ["emfolio-captures", "emfolio-test"]) {
    await s3.send(new HeadBucketCommand({ Bucket }));
  }
  ok("s3: buckets emfolio-captures and emfolio-test exist");

  const Bucket = "emfolio-test";
  const stamp = `verify-${Date.now()}`;

  // 1. PutObject with a stream body (needs ContentLength).
  const data = randomBytes(3 * 1024 * 1024 + 123);
  const key1 = `${stamp}/stream.bin`;
  await s3.send(
    new PutObjectCommand({
      Bucket,
      Key: key1,
      Body: Readable.from([data.subarray(0, 1_000_000), data.subarray(1_000_000)]),
      ContentLength: data.length,
      ContentType: "application/octet-stream",
    }),
  );
  const got1 = await bodyBytes((await s3.send(new GetObjectCommand({ Bucket, Key: key1 }))).Body);
  if (got1.length !== data.length || sha256(got1) !== sha256(data)) {
    throw new Error(`stream PutObject round trip differs: sent ${data.length} bytes, got ${got1.length}`);
  }
  ok(`s3: PutObject from a stream, ${data.length} bytes read back byte-identical`);

  // 2. Multipart upload of a stream of unknown length (lib-storage).
  const big = randomBytes(11 * 1024 * 1024 + 7);
  const key2 = `${stamp}/multipart.bin`;
  async function* chunks(): AsyncGenerator<Buffer> {
    for (let i = 0; i < big.length; i += 64 * 1024) yield big.subarray(i, i + 64 * 1024);
  }
  await new Upload({
    client: s3,
    params: { Bucket, Key: key2, Body: Readable.from(chunks()) },
    partSize: 5 * 1024 * 1024,
    queueSize: 2,
  }).done();
  const got2 = await bodyBytes((await s3.send(new GetObjectCommand({ Bucket, Key: key2 }))).Body);
  if (sha256(got2) !== sha256(big)) throw new Error("multipart upload round trip differs");
  ok(`s3: multipart Upload of a stream, ${big.length} bytes (3 parts) read back byte-identical`);

  // 3. Presigned PUT with curl, then a presigned GET.
  const key3 = `${stamp}/presigned.txt`;
  const tmp = mkdtempSync(path.join(tmpdir(), "emfolio-verify-"));
  const file = path.join(tmp, "upload.txt");
  const text = `presigned upload ${stamp}\n`;
  writeFileSync(file, text);
  const putUrl = await getSignedUrl(s3, new PutObjectCommand({ Bucket, Key: key3 }), { expiresIn: 300 });
  const putCode = curl(["-o", "/dev/null", "-w", "%{http_code}", "-T", file, putUrl]);
  if (putCode !== "200") throw new Error(`presigned PUT with curl answered ${putCode}`);
  const getUrl = await getSignedUrl(s3, new GetObjectCommand({ Bucket, Key: key3 }), { expiresIn: 300 });
  const back = curl([getUrl]);
  rmSync(tmp, { recursive: true, force: true });
  if (back !== text) throw new Error("presigned GET returned different content");
  ok("s3: presigned PUT with curl -T, presigned GET returns the same bytes");

  // 4. CORS: the preflight a browser sends before a PUT, and the ETag exposure on the PUT.
  const origin = "http://127.0.0.1:3000";
  const pre = curl([
    "-i", "-X", "OPTIONS", `${ENDPOINT}/emfolio-captures/some/key.csv`,
    "-H", `Origin: ${origin}`,
    "-H", "Access-Control-Request-Method: PUT",
    "-H", "Access-Control-Request-Headers: content-type",
  ]);
  if (!/^HTTP\/1\.1 200/m.test(pre) || !/^access-control-allow-methods:.*PUT/im.test(pre)) {
    throw new Error(`CORS preflight refused:\n${pre}`);
  }
  ok("s3: CORS preflight for PUT from http://127.0.0.1:3000 allowed");
  const putWithOrigin = curl([
    "-i", "-X", "PUT", "--data-binary", "cors check", "-H", `Origin: ${origin}`,
    await getSignedUrl(s3, new PutObjectCommand({ Bucket, Key: `${stamp}/cors.txt` }), { expiresIn: 300 }),
  ]);
  if (!/^access-control-expose-headers:.*ETag/im.test(putWithOrigin) || !/^etag:/im.test(putWithOrigin)) {
    throw new Error(`PUT with Origin does not expose ETag:\n${putWithOrigin}`);
  }
  ok("s3: PUT with an Origin header returns ETag and Access-Control-Expose-Headers: ETag");
  const foreign = curl(["-o", "/dev/null", "-w", "%{http_code}", "-X", "OPTIONS", `${ENDPOINT}/emfolio-captures/k.csv`, "-H", "Origin: http://elsewhere.example", "-H", "Access-Control-Request-Method: PUT"]);
  if (foreign !== "403") throw new Error(`CORS preflight from another origin answered ${foreign}, not 403`);
  ok("s3: CORS preflight from another origin refused (403)");
  const unsigned = curl(["-o", "/dev/null", "-w", "%{http_code}", `${ENDPOINT}/${Bucket}/${key3}`]);
  if (unsigned !== "403") throw new Error(`an unsigned GET answered ${unsigned}, not 403`);
  ok("s3: an unsigned GET refused (403)");

  for (const Key of [key1, key2, key3, `${stamp}/cors.txt`]) {
    await s3.send(new DeleteObjectCommand({ Bucket, Key }));
  }
  s3.destroy();
}

async function checkSmtp(): Promise<void> {
  const stranger = nodemailer.createTransport({ host: "127.0.0.1", port: SMTP_PORT, secure: false, ignoreTLS: true, auth: { user: "emfolio", pass: "wrong-password" } });
  const refused = await stranger.sendMail({ from: "x@example.test", to: "y@example.test", subject: "x", text: "x" }).then(() => null, (e: { responseCode?: number }) => e.responseCode ?? -1);
  stranger.close();
  if (refused !== 535) throw new Error(`the SMTP fake took mail with a wrong password (answer ${refused})`);
  ok("smtp: a wrong password is refused (535)");
  const transport = nodemailer.createTransport({
    host: "127.0.0.1",
    port: SMTP_PORT,
    secure: false,
    ignoreTLS: true,
    auth: { user: "emfolio", pass: SMTP_SECRET },
  });
  const subject = `Emfolio services verify ${new Date().toISOString()}`;
  const info = await transport.sendMail({
    from: "Emfolio <noreply@emfolio.local>",
    to: "Test Engineer <engineer@example.test>",
    bcc: "audit@example.test",
    subject,
    text: "Plain text body: report ready.",
    html: "<p>HTML body: <b>report ready</b>.</p>",
    attachments: [{ filename: "note.txt", content: "attached" }],
  });
  transport.close();
  const deadline = Date.now() + 5000;
  while (Date.now() < deadline) {
    const files = existsSync(MAIL_DIR) ? readdirSync(MAIL_DIR).filter((f) => f.endsWith(".json")) : [];
    for (const f of files.sort().reverse()) {
      const rec = JSON.parse(readFileSync(path.join(MAIL_DIR, f), "utf8")) as {
        messageId: string | null; subject: string; text: string | null; html: string | null; eml: string;
        envelope: { to: string[] };
      };
      if (rec.messageId === info.messageId) {
        if (rec.subject !== subject || !rec.text?.includes("report ready") || !rec.html?.includes("<b>")) {
          throw new Error(`stored mail ${f} has unexpected content`);
        }
        if (!existsSync(path.join(MAIL_DIR, rec.eml))) throw new Error(`raw ${rec.eml} missing`);
        if (!rec.envelope.to.includes("audit@example.test")) throw new Error("bcc recipient missing from envelope");
        ok(`smtp: test mail stored as .data/mail/${f} (+ ${rec.eml})`);
        return;
      }
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`mail ${info.messageId} was accepted but no JSON file appeared in ${MAIL_DIR}`);
}

async function checkUploadthing(): Promise<void> {
  const base = `http://127.0.0.1:${UT_PORT}`;
  const health = (await (await fetch(`${base}/health`)).json()) as { ok?: boolean };
  if (!health.ok) throw new Error("/health did not answer ok");
  const keyFile = path.join(root, ".data/uploadthing/apps/emfolio-test.key");
  if (!existsSync(keyFile)) throw new Error(`${keyFile} is missing: run 'bash scripts/services.sh env' once`);
  const token = Buffer.from(JSON.stringify({ apiKey: readFileSync(keyFile, "utf8").trim(), appId: "emfolio-test", regions: ["local"] })).toString("base64");
  const utapi = new UTApi({ token, apiUrl: base, ingestUrl: base, ufsHost: `localhost:${UT_PORT}`, ufsAppIdLocation: "path", logLevel: "Error" });
  const bytes = randomBytes(200_000);
  const up = await utapi.uploadFiles(new UTFile([bytes], `verify-${Date.now()}.bin`, { type: "application/octet-stream" }));
  if (up.error) throw new Error(`UTApi.uploadFiles failed: ${up.error.message}`);
  const { ufsUrl } = await utapi.generateSignedURL(up.data.key, { expiresIn: 60 });
  const back = Buffer.from(await (await fetch(ufsUrl)).arrayBuffer());
  if (sha256(back) !== sha256(bytes)) throw new Error("the signed read returned different bytes");
  ok(`uploadthing: UTApi upload of ${bytes.length} bytes, read back byte-identical through a signed URL`);
  const pre = await fetch(`${base}/${up.data.key}`, {
    method: "OPTIONS",
    headers: { Origin: "http://127.0.0.1:3000", "Access-Control-Request-Method": "PUT", "Access-Control-Request-Headers": "range,x-uploadthing-version" },
  });
  if (!/PUT/.test(pre.headers.get("access-control-allow-methods") ?? "")) throw new Error("CORS preflight for PUT refused");
  ok("uploadthing: CORS preflight for a browser PUT from http://127.0.0.1:3000 allowed");
  const { deletedCount } = await utapi.deleteFiles(up.data.key);
  const gone = await fetch(ufsUrl);
  if (deletedCount !== 1 || gone.status !== 404) throw new Error(`deleteFiles: ${deletedCount} deleted, then the file answered ${gone.status}`);
  ok("uploadthing: deleteFiles removed it (404 afterwards)");
}

async function main(): Promise<void> {
  const checks: [string, () => Promise<void>][] = [
    ["postgres", checkPostgres],
    ["redis", checkRedis],
    ["s3", checkS3],
    ["smtp", checkSmtp],
    ["uploadthing", checkUploadthing],
  ];
  for (const [name, check] of checks) {
    try {
      await check();
    } catch (err) {
      console.error(`FAIL ${name}: ${err instanceof Error ? err.message : String(err)}`);
      process.exit(1);
    }
  }
  console.log("all services verified");
}

void main();
