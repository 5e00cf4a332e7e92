// What a capture is: serial, test kind, speed (and roles, probe ratios) from a JSON sidecar or the file name.
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { TEST_KINDS } from "./options.mjs";

/** The file cannot be sent as it is; the reason goes beside it in the refused folder. */
export class RefusedError extends Error {}

export function sidecarOf(file) {
  for (const candidate of [`${file}.json`, file.replace(/\.(csv|txt|tsv)$/i, ".json")]) if (candidate !== file && existsSync(candidate)) return candidate;
  return null;
}

function fromSidecar(sidecar) {
  let data;
  try {
    data = JSON.parse(readFileSync(sidecar, "utf8"));
  } catch (error) {
    throw new RefusedError(`the sidecar ${path.basename(sidecar)} is not valid JSON: ${error.message}`);
  }
  if (typeof data !== "object" || data === null || Array.isArray(data)) throw new RefusedError(`the sidecar ${path.basename(sidecar)} must hold one JSON object`);
  const allowed = ["unitSerial", "testKind", "speedRpm", "channelRoles", "probeScales", "notes"];
  const unknown = Object.keys(data).filter((key) => !allowed.includes(key));
  if (unknown.length > 0) throw new RefusedError(`the sidecar ${path.basename(sidecar)} has unknown fields: ${unknown.join(", ")} (allowed: ${allowed.join(", ")})`);
  return data;
}

function fromName(name, pattern) {
  const match = pattern.exec(name);
  if (!match?.groups?.serial) throw new RefusedError(`the file name "${name}" does not match the name pattern ${pattern.source} and there is no JSON sidecar`);
  const { serial, kind, rpm } = match.groups;
  return { unitSerial: serial, ...(kind ? { testKind: kind } : {}), ...(rpm ? { speedRpm: Number(rpm) } : {}) };
}

/** Registration fields for one capture; the server checks them again. */
export function captureMeta(file, pattern, defaultKind) {
  const sidecar = sidecarOf(file);
  const meta = sidecar ? fromSidecar(sidecar) : fromName(path.basename(file), pattern);
  const testKind = meta.testKind ?? defaultKind;
  if (!testKind) throw new RefusedError("no test kind: name it in the file name, the sidecar or --test-kind");
  if (!TEST_KINDS.includes(testKind)) throw new RefusedError(`unknown test kind "${testKind}": use ${TEST_KINDS.join(", ")}`);
  if (typeof meta.unitSerial !== "string" || meta.unitSerial.trim() === "") throw new RefusedError("no unit serial");
  if (meta.speedRpm !== undefined && !(typeof meta.speedRpm === "number" && meta.speedRpm > 0)) throw new RefusedError(`speed must be a positive number of rpm, got ${meta.speedRpm}`);
  return { ...meta, unitSerial: meta.unitSerial.trim(), testKind, sidecar };
}
