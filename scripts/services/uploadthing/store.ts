/**
 * On-disk state of the uploadthing fake, under its data folder (default .data/uploadthing):
 *
 *   apps/<appId>.key              the app's API key (written by scripts/services.sh env)
 *   files/<appId>/<key>           a completed file's bytes
 *   files/<appId>/<key>.json      its StoredFile record, written last (temp file + rename)
 *   partial/<appId>/<key>         bytes received so far of an upload in progress (resumable)
 */
import { createHash } from "node:crypto";
import { appendFileSync, existsSync, mkdirSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";

export type StoredFile = {
  version: 1;
  appId: string;
  key: string;
  name: string;
  size: number;
  type: string;
  customId: string | null;
  acl: "public-read" | "private";
  contentDisposition: "inline" | "attachment";
  /** md5 of the bytes, hex, as the service reports `fileHash`. */
  fileHash: string;
  lastModified: number | null;
  uploadedAt: number;
};

const APP_ID = /^[A-Za-z0-9_-]{1,64}$/;
const FILE_KEY = /^[A-Za-z0-9]{12,128}$/;

export const isFileKey = (key: string) => FILE_KEY.test(key);

export class FakeStore {
  constructor(readonly dir: string) {
    mkdirSync(path.join(dir, "apps"), { recursive: true });
  }

  /** The API key of an app, read on every call so keys created while the fake runs work at once. */
  apiKeyOf(appId: string): string | null {
    if (!APP_ID.test(appId)) return null;
    const file = path.join(this.dir, "apps", `${appId}.key`);
    if (!existsSync(file)) return null;
    const key = readFileSync(file, "utf8").trim();
    return key.startsWith("sk_") ? key : null;
  }

  /** The app an `x-uploadthing-api-key` header belongs to. */
  appOfApiKey(apiKey: string | undefined): string | null {
    if (!apiKey) return null;
    for (const f of readdirSync(path.join(this.dir, "apps"))) {
      if (!f.endsWith(".key")) continue;
      const appId = f.slice(0, -4);
      if (this.apiKeyOf(appId) === apiKey) return appId;
    }
    return null;
  }

  private filePath(appId: string, key: string, suffix = "") {
    return path.join(this.dir, "files", appId, `${key}${suffix}`);
  }

  private partialPath(appId: string, key: string) {
    return path.join(this.dir, "partial", appId, key);
  }

  partialSize(appId: string, key: string): number {
    const p = this.partialPath(appId, key);
    return existsSync(p) ? statSync(p).size : 0;
  }

  /** Writes bytes at `start` (0 starts over; otherwise it must be the end of what is there). */
  writePart(appId: string, key: string, start: number, bytes: Buffer): number {
    const p = this.partialPath(appId, key);
    mkdirSync(path.dirname(p), { recursive: true });
    if (start === 0) writeFileSync(p, bytes);
    else appendFileSync(p, bytes);
    return statSync(p).size;
  }

  /** Moves a complete upload into place and records it. */
  complete(meta: Omit<StoredFile, "version" | "fileHash" | "uploadedAt">): StoredFile {
    const partial = this.partialPath(meta.appId, meta.key);
    const bytes = readFileSync(partial);
    const record: StoredFile = { version: 1, ...meta, fileHash: createHash("md5").update(bytes).digest("hex"), uploadedAt: Date.now() };
    mkdirSync(path.dirname(this.filePath(meta.appId, meta.key)), { recursive: true });
    renameSync(partial, this.filePath(meta.appId, meta.key));
    const json = this.filePath(meta.appId, meta.key, ".json");
    writeFileSync(`${json}.tmp-${process.pid}`, `${JSON.stringify(record, null, 2)}\n`);
    renameSync(`${json}.tmp-${process.pid}`, json);
    return record;
  }

  discardPartial(appId: string, key: string): void {
    rmSync(this.partialPath(appId, key), { force: true });
  }

  get(appId: string, key: string): StoredFile | null {
    if (!APP_ID.test(appId) || !isFileKey(key)) return null;
    const json = this.filePath(appId, key, ".json");
    if (!existsSync(json)) return null;
    return JSON.parse(readFileSync(json, "utf8")) as StoredFile;
  }

  /** A file by key alone (the `/f/<key>` form): keys carry their app's prefix, so at most one matches. */
  find(key: string): StoredFile | null {
    const root = path.join(this.dir, "files");
    if (!isFileKey(key) || !existsSync(root)) return null;
    for (const appId of readdirSync(root)) {
      const found = this.get(appId, key);
      if (found) return found;
    }
    return null;
  }

  bytesPath(file: StoredFile): string {
    return this.filePath(file.appId, file.key);
  }

  list(appId: string): StoredFile[] {
    const dir = path.join(this.dir, "files", appId);
    if (!APP_ID.test(appId) || !existsSync(dir)) return [];
    return readdirSync(dir)
      .filter((f) => f.endsWith(".json"))
      .map((f) => JSON.parse(readFileSync(path.join(dir, f), "utf8")) as StoredFile)
      .sort((a, b) => a.uploadedAt - b.uploadedAt);
  }

  /** Deletes by file key or custom id; returns how many files went. */
  delete(appId: string, match: { fileKeys?: string[]; customIds?: string[] }): number {
    let n = 0;
    for (const f of this.list(appId)) {
      const hit = match.fileKeys?.includes(f.key) || (f.customId !== null && match.customIds?.includes(f.customId));
      if (!hit) continue;
      rmSync(this.filePath(appId, f.key, ".json"), { force: true });
      rmSync(this.filePath(appId, f.key), { force: true });
      n += 1;
    }
    return n;
  }
}
