import { z } from "zod";

// The one place that reads process.env. Empty strings count as missing.
const blankToUndefined = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);
const str = () => z.preprocess(blankToUndefined, z.string());
const url = () => z.preprocess(blankToUndefined, z.url());
const int = (def: number) => z.preprocess(blankToUndefined, z.coerce.number().int().positive().default(def));

/** An uploadthing token: base64 of `{"apiKey":"sk_…","appId":"…","regions":["…"]}`. */
export const uploadthingTokenSchema = z.string().refine((token) => {
  try {
    const parsed = z.object({ apiKey: z.string().startsWith("sk_"), appId: z.string().min(1), regions: z.array(z.string()).min(1) })
      .safeParse(JSON.parse(atob(token)));
    return parsed.success;
  } catch {
    return false;
  }
}, "must be base64 of a JSON object { apiKey: \"sk_…\", appId, regions: [...] }");

export const envSchema = z.object({
  NODE_ENV: z.preprocess(blankToUndefined, z.enum(["development", "production", "test"]).default("development")),
  DATABASE_URL: url(),
  REDIS_URL: url(),
  QUEUE_PREFIX: z.preprocess(blankToUndefined, z.string().regex(/^[a-z0-9_-]+$/).default("emfolio")),
  S3_ENDPOINT: url(),
  S3_PUBLIC_ENDPOINT: z.preprocess(blankToUndefined, z.url().optional()),
  S3_REGION: z.preprocess(blankToUndefined, z.string().default("us-east-1")),
  S3_ACCESS_KEY_ID: str(),
  S3_SECRET_ACCESS_KEY: str(),
  S3_BUCKET: str(),
  S3_FORCE_PATH_STYLE: z.preprocess(blankToUndefined, z.enum(["true", "false"]).default("true")),
  NEXTAUTH_SECRET: z.preprocess(blankToUndefined, z.string().min(32, "must be at least 32 characters")),
  NEXTAUTH_URL: url(),
  SMTP_HOST: z.preprocess(blankToUndefined, z.string().default("127.0.0.1")),
  SMTP_PORT: int(2529),
  /** SMTP AUTH (the local fake requires it: user emfolio, the password from `scripts/services.sh env`). */
  SMTP_USER: z.preprocess(blankToUndefined, z.string().optional()),
  SMTP_PASSWORD: z.preprocess(blankToUndefined, z.string().optional()),
  MAIL_FROM: z.preprocess(blankToUndefined, z.string().default("Emfolio <no-reply@emfolio.invalid>")),
  MAIL_DIR: z.preprocess(blankToUndefined, z.string().optional()),
  UPLOAD_MAX_BYTES: int(2 * 1024 * 1024 * 1024),
  // An upload not completed within this many hours is abandoned: its parts and row are removed.
  // At least twice the 1 h life of an upload URL, so a part still in flight is never cut off.
  UPLOAD_ABANDON_HOURS: z.preprocess(blankToUndefined, z.coerce.number().int().min(2, "must be at least 2 (upload URLs live 1 h)").default(24)),
  WORKER_CONCURRENCY: int(1),
  // How long a worker holds a job before another may take it over (stalled-job recovery), in ms.
  WORKER_LOCK_MS: int(30_000),
  // How often the worker looks for captures left queued or analysing without a live job, in s.
  WORKER_SWEEP_INTERVAL_S: int(10),
  // How long one analysis attempt waits for a service that does not answer (database, file
  // store) before that attempt counts as spent, in s. Such outages never end a capture.
  WORKER_OUTAGE_WAIT_S: int(600),
  // Tries per analysis job for infrastructure errors (bad input is never retried).
  ANALYSIS_ATTEMPTS: int(5),
  // Backpressure: the bench API answers 429 (with Retry-After) to new registrations while more
  // captures than this wait for or are in analysis.
  ANALYSIS_BACKLOG_LIMIT: int(2000),
  SIGN_IN_MAX_ATTEMPTS: int(8),
  // Comma-separated addresses of reverse proxies whose X-Forwarded-For is believed (scripts/serve.ts);
  // empty: the client address is the socket's.
  TRUSTED_PROXIES: z.preprocess(blankToUndefined, z.string().regex(/^[0-9a-fA-F:.,\s]+$/, "must be comma-separated IP addresses").optional()),
  SIGN_IN_WINDOW_S: int(900),
  // Attachments (uploadthing). Optional here so the worker and scripts start without them; the
  // attachment code names a missing token when it is used. The names are the ones the SDK reads.
  UPLOADTHING_TOKEN: z.preprocess(blankToUndefined, uploadthingTokenSchema.optional()),
  UPLOADTHING_INGEST_URL: z.preprocess(blankToUndefined, z.url().optional()),
  UPLOADTHING_API_URL: z.preprocess(blankToUndefined, z.url().optional()),
  // Where the app reaches its own upload route; default NEXTAUTH_URL + /api/uploadthing.
  UPLOADTHING_CALLBACK_URL: z.preprocess(blankToUndefined, z.url().optional()),
  UPLOADTHING_UFS_HOST: z.preprocess(blankToUndefined, z.string().optional()),
  UPLOADTHING_UFS_APP_ID_LOCATION: z.preprocess(blankToUndefined, z.enum(["subdomain", "path"]).default("subdomain")),
});

export type Env = Readonly<z.infer<typeof envSchema>>;

let cached: Env | undefined;

/** Parses the environment once; throws an error that names every missing or bad variable. */
export function getEnv(): Env {
  if (cached) return cached;
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Emfolio configuration is incomplete (see .env.example):\n${lines.join("\n")}`);
  }
  cached = Object.freeze(parsed.data);
  return cached;
}

/**
 * EMFOLIO_INGEST_TRACE=1 prints the parallel reader's timeline to stderr (for the benchmark). Read on
 * its own so the command-line analyser, which has no database or store settings, can use it too.
 */
export function ingestTraceEnabled(): boolean {
  return Boolean(blankToUndefined(process.env.EMFOLIO_INGEST_TRACE));
}

/** This process's environment plus `overrides`, for a child process (workers the tests and benchmarks start). */
export function childProcessEnv(overrides: Record<string, string> = {}): NodeJS.ProcessEnv {
  return { ...process.env, ...overrides };
}

/** Only PATH plus `overrides`: a child that must not inherit this process's settings (the bench-PC uploader). */
export function bareChildEnv(overrides: Record<string, string> = {}): NodeJS.ProcessEnv {
  return { PATH: process.env.PATH ?? "", NODE_ENV: process.env.NODE_ENV, ...overrides };
}
