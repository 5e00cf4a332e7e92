import type { PartUrl, UploadPlan } from "@/lib/captures/input-schemas";
import { postPresignParts } from "./fetchers";
import { Sha256 } from "./sha256";
import { StoreAnswerError, withRetries } from "./upload-retry";

// Browser → object store, straight through the presigned URLs (the app never carries the bytes).
// XMLHttpRequest rather than fetch: it reports upload progress. Every URL is bound to the bytes it
// was issued for (length and sha256), so each part's sha256 is computed before its URL is asked for.
// A part that fails on the network or with 429/5xx is sent again (bounded; see upload-retry.ts).

function put(url: string, body: Blob, headers: Record<string, string>, onBytes: (sent: number) => void, signal?: AbortSignal): Promise<string> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("PUT", url);
    for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
    xhr.upload.onprogress = (e) => onBytes(e.loaded);
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) return resolve(xhr.getResponseHeader("ETag") ?? "");
      const code = /<Code>([^<]+)<\/Code>/.exec(xhr.responseText ?? "")?.[1] ?? null;
      reject(new StoreAnswerError(xhr.status, code, xhr.getResponseHeader("Retry-After"), `The object store answered ${xhr.status}${code ? ` (${code})` : ""}`));
    };
    xhr.onerror = () => reject(new StoreAnswerError(0, null, null, "The upload was interrupted (network error)"));
    xhr.onabort = () => reject(new Error("The upload was cancelled"));
    signal?.addEventListener("abort", () => xhr.abort());
    xhr.send(body);
  });
}

async function sha256Hex(blob: Blob): Promise<string> {
  const bytes = new Uint8Array(await blob.arrayBuffer());
  if (globalThis.crypto?.subtle) {
    const digest = new Uint8Array(await globalThis.crypto.subtle.digest("SHA-256", bytes));
    return Array.from(digest, (b) => b.toString(16).padStart(2, "0")).join("");
  }
  return new Sha256().update(bytes).digestHex();
}

const PARALLEL_PARTS = 3;

export type UploadedPart = { partNumber: number; etag: string; sha256: string };

/** Uploads the file by the plan; returns each part's ETag and sha256 for a multipart upload. */
export async function putCaptureObject(
  captureId: string, file: File, plan: UploadPlan, onFraction: (f: number) => void, signal?: AbortSignal,
): Promise<UploadedPart[] | undefined> {
  if (plan.kind === "single") {
    await withRetries(file.name, async () => {
      try {
        await put(plan.url, file, plan.headers, (sent) => onFraction(sent / file.size), signal);
      } catch (err) {
        // 412: this very file (the URL is bound to its sha256) is stored already, from an earlier try.
        if (!(err instanceof StoreAnswerError && err.status === 412)) throw err;
      }
    });
    onFraction(1);
    return undefined;
  }
  const { partSize, partCount } = plan;
  const sent = new Map<number, number>();
  const report = () => onFraction([...sent.values()].reduce((a, b) => a + b, 0) / file.size);
  const queue = Array.from({ length: partCount }, (_, i) => i + 1);
  const done: UploadedPart[] = [];
  async function lane(): Promise<void> {
    for (let number = queue.shift(); number; number = queue.shift()) {
      const partNumber = number;
      const body = file.slice((partNumber - 1) * partSize, partNumber * partSize);
      const sha256 = await sha256Hex(body);
      const etag = await withRetries(`${file.name}, part ${partNumber}`, async () => {
        // A fresh URL for every try: the one before may have expired while the store was away.
        const issued: PartUrl | undefined = (await postPresignParts(captureId, [{ partNumber, sha256 }])).parts[0];
        if (!issued) throw new Error(`No upload URL was issued for part ${partNumber}`);
        sent.set(partNumber, 0);
        return put(issued.url, body, issued.headers, (bytes) => { sent.set(partNumber, bytes); report(); }, signal);
      });
      done.push({ partNumber, etag, sha256 });
    }
  }
  await Promise.all(Array.from({ length: PARALLEL_PARTS }, lane));
  onFraction(1);
  return done.sort((a, b) => a.partNumber - b.partNumber);
}
