import { createServer, type IncomingMessage } from "node:http";
import type { AddressInfo } from "node:net";
import { createRouteHandler } from "uploadthing/server";
import { findActiveUserByEmail } from "@/db/queries/users";
import { createAttachmentRouter } from "@/lib/attachments/file-router";
import type { AttachmentUploadInput } from "@/lib/attachments/rules";
import type { SessionUser } from "@/lib/auth/options";
import { uploadRouteConfig } from "@/lib/server/uploadthing";

// The app's upload route (the real file router and uploadthing's handler) served on an ephemeral
// port, so the uploadthing fake can call it back; plus the browser's side of an upload, done by hand
// (the SDK's browser client needs XMLHttpRequest, which the e2e test covers in Chromium).

export async function sessionUser(email: string): Promise<SessionUser> {
  const row = await findActiveUserByEmail(email);
  if (!row) throw new Error(`no seeded user ${email}: run the test command, which seeds it`);
  const { passwordHash: _, ...user } = row;
  return user;
}

async function toRequest(req: IncomingMessage, origin: string): Promise<Request> {
  const chunks: Buffer[] = [];
  for await (const c of req) chunks.push(c as Buffer);
  const headers = new Headers();
  for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers.set(k, v);
  const body = chunks.length > 0 ? new Uint8Array(Buffer.concat(chunks)) : undefined;
  return new Request(`${origin}${req.url}`, { method: req.method, headers, body });
}

export type UploadRoute = { base: string; as: (user: SessionUser | null) => void; close: () => Promise<void> };

/** Serves /api/uploadthing for whoever `as()` last named; `isDev` picks the SDK's development flow. */
export async function startUploadRoute(opts: { isDev: boolean }): Promise<UploadRoute> {
  let current: SessionUser | null = null;
  let base = "";
  let handler: ((r: Request) => Promise<Response>) | undefined;
  const server = createServer((req, res) => {
    toRequest(req, base)
      .then((request) => (handler as (r: Request) => Promise<Response>)(request))
      .then(async (response) => {
        res.writeHead(response.status, Object.fromEntries(response.headers));
        res.end(Buffer.from(await response.arrayBuffer()));
      })
      .catch((err: unknown) => {
        res.writeHead(500);
        res.end(String(err));
      });
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  handler = createRouteHandler({
    router: createAttachmentRouter({ currentUser: async () => current }),
    config: { ...uploadRouteConfig(), callbackUrl: `${base}/api/uploadthing`, isDev: opts.isDev, logLevel: "Error" },
  });
  return {
    base,
    as: (user) => { current = user; },
    close: () => new Promise((resolve) => server.close(() => resolve())),
  };
}

export type Presigned = { url: string; key: string; name: string; customId: string | null };

/** Step 1 of the browser's upload: ask the app's route for presigned URLs. */
export async function requestUpload(route: UploadRoute, files: { name: string; type: string; size: number }[], input: AttachmentUploadInput) {
  const res = await fetch(`${route.base}/api/uploadthing?actionType=upload&slug=unitAttachment`, {
    method: "POST",
    headers: { "content-type": "application/json", "x-uploadthing-package": "@uploadthing/react", "x-uploadthing-version": "7.7.4" },
    body: JSON.stringify({ files: files.map((f) => ({ ...f, lastModified: 1_767_225_600_000 })), input }),
  });
  const body: unknown = await res.json();
  return { status: res.status, presigned: res.ok ? (body as Presigned[]) : [], error: res.ok ? null : (body as { message: string }).message };
}

/** Step 2: HEAD for the resume offset, then the multipart PUT, as uploadthing/client does. */
export async function putFile(url: string, bytes: Buffer, name: string, type: string) {
  const head = await fetch(url, { method: "HEAD" });
  const start = Number(head.headers.get("x-ut-range-start") ?? "0");
  const form = new FormData();
  form.append("file", new File([new Uint8Array(bytes.subarray(start))], name, { type }));
  const res = await fetch(url, { method: "PUT", headers: { Range: `bytes=${start}-`, "x-uploadthing-version": "7.7.4" }, body: form });
  return { status: res.status, body: (await res.json()) as { serverData?: { attachmentId: string }; fileHash?: string; ufsUrl?: string; error?: string } };
}

export async function uploadPng(route: UploadRoute, bytes: Buffer, name: string, input: AttachmentUploadInput) {
  const asked = await requestUpload(route, [{ name, type: "image/png", size: bytes.length }], input);
  const p = asked.presigned[0];
  if (!p) throw new Error(`no presigned URL: ${asked.status} ${asked.error}`);
  const put = await putFile(p.url, bytes, name, "image/png");
  if (put.status !== 200 || !put.body.serverData) throw new Error(`PUT failed: ${put.status} ${put.body.error}`);
  return { key: p.key, url: p.url, attachmentId: put.body.serverData.attachmentId, fileHash: put.body.fileHash };
}
