import { UTApi } from "uploadthing/server";
import { getEnv } from "./env";

// Settings for uploadthing's SDK come from getEnv() and are passed explicitly, so the SDK's own
// reading of process.env (UPLOADTHING_*: the same names) never decides anything on its own.

/** How long a signed file URL made for one download stays valid, in seconds. */
const FILE_URL_TTL_S = 60;

export class AttachmentStoreNotConfigured extends Error {
  constructor() {
    super("UPLOADTHING_TOKEN is not set: attachments need the uploadthing settings (see .env.example)");
  }
}

function token(): string {
  const value = getEnv().UPLOADTHING_TOKEN;
  if (!value) throw new AttachmentStoreNotConfigured();
  return value;
}

/** Options for createRouteHandler (app/api/uploadthing/route.ts). */
export function uploadRouteConfig() {
  const env = getEnv();
  return {
    token: token(),
    ingestUrl: env.UPLOADTHING_INGEST_URL,
    callbackUrl: env.UPLOADTHING_CALLBACK_URL ?? new URL("/api/uploadthing", env.NEXTAUTH_URL).toString(),
    isDev: env.NODE_ENV === "development",
    // At info level the SDK logs every presigned URL, signature included.
    logLevel: "Warning" as const,
  };
}

let utapi: UTApi | undefined;

export function getUtApi(): UTApi {
  if (utapi) return utapi;
  const env = getEnv();
  utapi = new UTApi({
    token: token(),
    apiUrl: env.UPLOADTHING_API_URL,
    ingestUrl: env.UPLOADTHING_INGEST_URL,
    ufsHost: env.UPLOADTHING_UFS_HOST,
    ufsAppIdLocation: env.UPLOADTHING_UFS_APP_ID_LOCATION,
    logLevel: "Warning",
  });
  return utapi;
}

/**
 * The stored bytes of a file, fetched server-side through a short-lived signed URL (files are
 * private); null when the store no longer has it. The URL never leaves the server.
 */
export async function fetchStoredFile(fileKey: string): Promise<Response | null> {
  const { ufsUrl } = await getUtApi().generateSignedURL(fileKey, { expiresIn: FILE_URL_TTL_S });
  const res = await fetch(ufsUrl, { cache: "no-store" });
  if (res.status === 404) {
    await res.body?.cancel();
    return null;
  }
  if (!res.ok || !res.body) {
    await res.body?.cancel();
    throw new Error(`the attachment store answered ${res.status} for a stored file`);
  }
  return res;
}

export async function deleteStoredFiles(fileKeys: string[]): Promise<number> {
  if (fileKeys.length === 0) return 0;
  const { deletedCount } = await getUtApi().deleteFiles(fileKeys);
  return deletedCount;
}

/** For the preflight: the token is accepted by the service (a cheap authenticated call). */
export async function pingAttachmentStore(): Promise<void> {
  await getUtApi().getUsageInfo();
}
