import type { UploadPlan } from "@/lib/captures/input-schemas";
import { postPresignParts } from "./fetchers";

// Browser → object store, straight through the presigned URLs (the app never carries the bytes).
// XMLHttpRequest rather than fetch: it reports upload progress.

function put(url: string, body: Blob, headers: Record<string, string>, onBytes: (sent: number) => void, signal?: AbortSignal): Promise<string> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("PUT", url);
    for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
    xhr.upload.onprogress = (e) => onBytes(e.loaded);
    xhr.onload = () => (xhr.status >= 200 && xhr.status < 300 ? resolve(xhr.getResponseHeader("ETag") ?? "") : reject(new Error(`The object store answered ${xhr.status}`)));
    xhr.onerror = () => reject(new Error("The upload was interrupted (network error)"));
    xhr.onabort = () => reject(new Error("The upload was cancelled"));
    signal?.addEventListener("abort", () => xhr.abort());
    xhr.send(body);
  });
}

const PARALLEL_PARTS = 3;

/** Uploads the file by the plan; returns the part ETags of a multipart upload. */
export async function putCaptureObject(
  captureId: string, file: File, plan: UploadPlan, onFraction: (f: number) => void, signal?: AbortSignal,
): Promise<{ partNumber: number; etag: string }[] | undefined> {
  if (plan.kind === "single") {
    await put(plan.url, file, plan.headers, (sent) => onFraction(sent / file.size), signal);
    onFraction(1);
    return undefined;
  }
  const { partSize, expiresInS } = plan;
  const sent = new Map<number, number>();
  const report = () => onFraction([...sent.values()].reduce((a, b) => a + b, 0) / file.size);
  const queue = [...plan.parts];
  const done: { partNumber: number; etag: string }[] = [];
  const startedAt = Date.now();
  async function lane(): Promise<void> {
    for (let part = queue.shift(); part; part = queue.shift()) {
      let url = part.url;
      // Presigned URLs expire: a long upload asks for a fresh one.
      if (Date.now() - startedAt > (expiresInS - 120) * 1000) url = (await postPresignParts(captureId, [part.partNumber])).parts[0]?.url ?? url;
      const body = file.slice((part.partNumber - 1) * partSize, part.partNumber * partSize);
      const number = part.partNumber;
      const etag = await put(url, body, {}, (bytes) => { sent.set(number, bytes); report(); }, signal);
      done.push({ partNumber: number, etag });
    }
  }
  await Promise.all(Array.from({ length: PARALLEL_PARTS }, lane));
  onFraction(1);
  return done.sort((a, b) => a.partNumber - b.partNumber);
}
