// The watched folder: captures that stopped growing, and moving them aside when done.
import { createHash } from "node:crypto";
import { createReadStream, existsSync, mkdirSync, readdirSync, renameSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";

export const SENT_DIR = "sent";
export const REFUSED_DIR = "refused";
const CAPTURE = /\.(csv|txt|tsv)$/i;

/** Follows each capture's size and modification time; a file is ready once unchanged for `settleMs`. */
export function createSettleWatch(folder, settleMs, ignore) {
  const seen = new Map();
  return function look(now = Date.now()) {
    const ready = [];
    let settling = 0;
    const present = new Set();
    for (const entry of readdirSync(folder, { withFileTypes: true })) {
      if (!entry.isFile() || entry.name.startsWith(".") || !CAPTURE.test(entry.name)) continue;
      const file = path.join(folder, entry.name);
      if (ignore.has(file)) continue;
      let info;
      try {
        info = statSync(file);
      } catch {
        continue;
      }
      present.add(file);
      const last = seen.get(file);
      if (!last || last.size !== info.size || last.mtimeMs !== info.mtimeMs) {
        seen.set(file, { size: info.size, mtimeMs: info.mtimeMs, since: now });
        settling++;
      } else if (now - last.since >= settleMs && info.size > 0) {
        ready.push(file);
      } else {
        settling++;
      }
    }
    for (const file of seen.keys()) if (!present.has(file)) seen.delete(file);
    return { ready, settling };
  };
}

export function sha256File(file) {
  return new Promise((resolve, reject) => {
    const hash = createHash("sha256");
    createReadStream(file).on("data", (chunk) => hash.update(chunk)).on("end", () => resolve(hash.digest("hex"))).on("error", reject);
  });
}

function freeName(dir, name, tag) {
  if (!existsSync(path.join(dir, name))) return name;
  const ext = path.extname(name);
  return `${path.basename(name, ext)}-${tag}${ext}`;
}

/** Moves a capture (and its sidecar) into sent/ or refused/, with the reason beside a refused one. */
export function moveAside(folder, file, kind, { sidecar, reason, tag }) {
  const dir = path.join(folder, kind);
  mkdirSync(dir, { recursive: true });
  const name = freeName(dir, path.basename(file), tag);
  renameSync(file, path.join(dir, name));
  if (sidecar && existsSync(sidecar)) renameSync(sidecar, path.join(dir, `${name}.json`));
  if (reason) writeFileSync(path.join(dir, `${name}.reason.txt`), `${reason}\n`);
  return path.join(dir, name);
}
