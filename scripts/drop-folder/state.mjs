// The uploader's memory: files sent (by sha256) and uploads in progress; the log file.
import { appendFileSync, existsSync, readFileSync, renameSync, writeFileSync } from "node:fs";

export function loadState(file) {
  if (!existsSync(file)) return { version: 1, sent: {}, pending: {} };
  const state = JSON.parse(readFileSync(file, "utf8"));
  return { version: 1, sent: state.sent ?? {}, pending: state.pending ?? {} };
}

/** Written to a temporary file and renamed over the old one: a crash never leaves half a state. */
export function saveState(file, state) {
  const temporary = `${file}.${process.pid}.tmp`;
  writeFileSync(temporary, JSON.stringify(state, null, 1), { mode: 0o600 });
  renameSync(temporary, file);
}

export function createLog(file, { quiet = false } = {}) {
  return (level, message) => {
    const line = `${new Date().toISOString()} ${level.padEnd(7)} ${message}`;
    appendFileSync(file, `${line}\n`);
    if (!quiet) (level === "error" || level === "refused" ? process.stderr : process.stdout).write(`${line}\n`);
  };
}
