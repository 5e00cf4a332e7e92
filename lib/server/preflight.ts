import { HeadBucketCommand } from "@aws-sdk/client-s3";
import { Redis } from "ioredis";
import { createConnection } from "node:net";
import { pingDatabase } from "@/db/queries/health";
import { getEnv } from "./env";
import { getS3 } from "./storage";
import { pingAttachmentStore } from "./uploadthing";

export type ServiceCheck = { service: string; ok: boolean; detail: string };

const TIMEOUT_MS = 4000;

function withTimeout<T>(p: Promise<T>, what: string): Promise<T> {
  return Promise.race([p, new Promise<T>((_, reject) => setTimeout(() => reject(new Error(`${what} did not answer within ${TIMEOUT_MS / 1000} s`)), TIMEOUT_MS))]);
}

async function check(service: string, where: string, run: () => Promise<unknown>): Promise<ServiceCheck> {
  try {
    await withTimeout(run(), service);
    return { service, ok: true, detail: where };
  } catch (err) {
    return { service, ok: false, detail: `${where}: ${err instanceof Error ? err.message : String(err)}` };
  }
}

function redacted(url: string): string {
  const u = new URL(url);
  u.password = u.password ? "***" : "";
  return u.toString();
}

/** Reaches every service the app needs and says, per service, whether it answered. */
export async function checkServices(): Promise<ServiceCheck[]> {
  const env = getEnv();
  return Promise.all([
    check("PostgreSQL", redacted(env.DATABASE_URL), pingDatabase),
    check("Redis", redacted(env.REDIS_URL), async () => {
      const redis = new Redis(env.REDIS_URL, { lazyConnect: true, maxRetriesPerRequest: 0, retryStrategy: () => null });
      redis.on("error", () => undefined);
      try {
        await redis.connect();
        await redis.ping();
      } finally {
        redis.disconnect();
      }
    }),
    check("object store", `${env.S3_ENDPOINT} bucket ${env.S3_BUCKET}`, () => getS3().send(new HeadBucketCommand({ Bucket: env.S3_BUCKET }))),
    check("mail server", `${env.SMTP_HOST}:${env.SMTP_PORT}`, () => new Promise<void>((resolve, reject) => {
      const socket = createConnection({ host: env.SMTP_HOST, port: env.SMTP_PORT }, () => { socket.end(); resolve(); });
      socket.on("error", reject);
    })),
    check("attachments", env.UPLOADTHING_API_URL ?? "uploadthing (default API URL)", pingAttachmentStore),
  ]);
}
