import { spawn, execFileSync, type ChildProcess } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { GetObjectCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import nodemailer from "nodemailer";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { bareChildEnv, getEnv } from "@/lib/server/env";

// The local fakes locked down: the object store on a full disk (its --quota-bytes option stands in
// for the disk), the SMTP fake's password, loopback-only listeners, the uploadthing fake's API key.

const QUOTA = 4096;
const SECRET = "quota-test-secret-0123456789";
let dir: string;
let store: ChildProcess;
let client: S3Client;
let log = "";

function startStore(args = ["--dir", path.join(dir, "s3"), "--quota-bytes", String(QUOTA)]): Promise<number> {
  log = "";
  store = spawn(process.execPath, ["--import", "tsx", "scripts/services/s3-server.ts", "--port", "0", "--secret-file", path.join(dir, "secret"), "--bucket", "quota", ...args], {
    env: bareChildEnv({ NODE_OPTIONS: "--openssl-legacy-provider" }), stdio: ["ignore", "pipe", "pipe"],
  });
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`the store did not start:\n${log}`)), 30_000);
    const read = (d: Buffer) => {
      log += d.toString();
      const port = /listening on 127\.0\.0\.1:(\d+)/.exec(log)?.[1];
      if (port) {
        clearTimeout(timer);
        resolve(Number(port));
      }
    };
    store.stdout?.on("data", read);
    store.stderr?.on("data", read);
    store.on("exit", (code) => reject(new Error(`the store exited (${code}):\n${log}`)));
  });
}

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), "emfolio-store-"));
  writeFileSync(path.join(dir, "secret"), SECRET);
  const port = await startStore();
  client = new S3Client({
    endpoint: `http://127.0.0.1:${port}`, region: "us-east-1", forcePathStyle: true, credentials: { accessKeyId: "S3RVER", secretAccessKey: SECRET },
    requestChecksumCalculation: "WHEN_REQUIRED", responseChecksumValidation: "WHEN_REQUIRED",
  });
});

afterAll(() => {
  store?.kill("SIGTERM");
  rmSync(dir, { recursive: true, force: true });
});

const put = (Key: string, bytes: number, to = client) => to.send(new PutObjectCommand({ Bucket: "quota", Key, Body: Buffer.alloc(bytes, 97), ContentLength: bytes }));

/** A 2 MiB tmpfs (a real full disk), where this machine lets the test mount one (root, a kernel that allows it). */
function smallDisk(): string | null {
  const at = mkdtempSync(path.join(tmpdir(), "emfolio-full-disk-"));
  try {
    execFileSync("mount", ["-t", "tmpfs", "-o", "size=2m", "tmpfs", at], { stdio: "ignore" });
    return at;
  } catch {
    rmSync(at, { recursive: true, force: true });
    return null;
  }
}

describe("scripts/services/s3-server.ts on a full disk", () => {
  it("s3-server --quota-bytes answers 507 with a sentence when a write would not fit, stores nothing of it, and keeps serving", async () => {
    await put("first.csv", 1000);
    const refused = await put("too-big.csv", QUOTA).then(() => null, (e: { name?: string; message?: string; $metadata?: { httpStatusCode?: number } }) => e);
    expect(refused?.$metadata?.httpStatusCode).toBe(507);
    expect(refused?.name).toBe("InsufficientStorage");
    expect(refused?.message).toMatch(/disk is full.*Nothing was stored/);
    expect(store.exitCode).toBeNull();
    await expect(client.send(new GetObjectCommand({ Bucket: "quota", Key: "too-big.csv" }))).rejects.toMatchObject({ name: "NoSuchKey" });
    const first = await client.send(new GetObjectCommand({ Bucket: "quota", Key: "first.csv" }));
    expect((await first.Body!.transformToByteArray()).length).toBe(1000);
    await put("small.csv", 500);
  });
});

describe("scripts/services/s3-server.ts on a disk that is really full (ENOSPC)", () => {
  const disk = smallDisk();
  afterAll(() => {
    if (!disk) return;
    try { execFileSync("umount", [disk], { stdio: "ignore" }); } catch { /* already gone */ }
    rmSync(disk, { recursive: true, force: true });
  });
  it.skipIf(disk === null)("a write larger than the disk answers 507 with a sentence, the store stays up and serves what it holds", async () => {
    const first = store;
    const port = await startStore(["--dir", path.join(disk as string, "s3"), "--spool-dir", path.join(disk as string, "spool")]);
    const full = new S3Client({
      endpoint: `http://127.0.0.1:${port}`, region: "us-east-1", forcePathStyle: true, credentials: { accessKeyId: "S3RVER", secretAccessKey: SECRET },
      requestChecksumCalculation: "WHEN_REQUIRED", responseChecksumValidation: "WHEN_REQUIRED",
    });
    try {
      await put("kept.csv", 4000, full);
      const refused = await put("too-big.csv", 3 * 1024 * 1024, full).then(() => null, (e: { name?: string; message?: string; $metadata?: { httpStatusCode?: number } }) => e);
      expect(refused?.$metadata?.httpStatusCode, log).toBe(507);
      expect(refused?.message).toMatch(/disk is full/);
      expect(store.exitCode).toBeNull();
      const kept = await full.send(new GetObjectCommand({ Bucket: "quota", Key: "kept.csv" }));
      expect((await kept.Body!.transformToByteArray()).length).toBe(4000);
      await expect(full.send(new GetObjectCommand({ Bucket: "quota", Key: "too-big.csv" }))).rejects.toMatchObject({ name: "NoSuchKey" });
    } finally {
      store.kill("SIGTERM");
      await new Promise((r) => (store.exitCode !== null ? r(null) : store.once("exit", r)));
      store = first;
    }
  });
});

describe("the SMTP fake", () => {
  const transport = (auth?: { user: string; pass: string }) =>
    nodemailer.createTransport({ host: getEnv().SMTP_HOST, port: getEnv().SMTP_PORT, secure: false, ignoreTLS: true, ...(auth ? { auth } : {}) });
  const send = (t: nodemailer.Transporter) =>
    t.sendMail({ from: "noreply@emfolio.local", to: "engineer@example.test", subject: "services check", text: "x" }).then(() => 0, (e: { responseCode?: number }) => e.responseCode ?? -1);

  it("the SMTP fake refuses mail without AUTH (530) and with a wrong password (535), and takes it with its secret", async () => {
    expect(await send(transport())).toBe(530);
    expect(await send(transport({ user: getEnv().SMTP_USER ?? "emfolio", pass: "not-the-secret" }))).toBe(535);
    expect(await send(transport({ user: getEnv().SMTP_USER ?? "", pass: getEnv().SMTP_PASSWORD ?? "" }))).toBe(0);
  });
});

describe("the other fakes", () => {
  it("the SMTP, uploadthing and object store fakes listen on 127.0.0.1 only", () => {
    const ports = [getEnv().SMTP_PORT, Number(new URL(getEnv().UPLOADTHING_API_URL ?? "http://x:0").port), Number(new URL(getEnv().S3_ENDPOINT).port)];
    for (const port of ports) {
      const listeners = execFileSync("ss", ["-Hltn", `sport = :${port}`], { encoding: "utf8" }).trim().split("\n").map((l) => l.split(/\s+/)[3]);
      expect(listeners.length).toBeGreaterThan(0);
      for (const local of listeners) expect(local).toBe(`127.0.0.1:${port}`);
    }
  });

  it("the uploadthing fake refuses server calls without its app's API key (401)", async () => {
    const api = getEnv().UPLOADTHING_API_URL ?? "";
    const call = (key?: string) => fetch(`${api}/v6/listFiles`, { method: "POST", headers: { "content-type": "application/json", ...(key ? { "x-uploadthing-api-key": key } : {}) }, body: "{}" });
    expect((await call()).status).toBe(401);
    expect((await call("sk_live_not-a-key")).status).toBe(401);
  });
});
