"use client";

import { useCallback, useState } from "react";
import { sniffCaptureBytes, type ChannelRole } from "@/lib/analysis";
import { CAPTURE_FILE_NAME, captureRegistrationSchema, type CaptureRegistration } from "@/lib/captures/input-schemas";
import { postComplete, postRegistration } from "./fetchers";
import { putCaptureObject } from "./put-object";
import { sha256OfBlob } from "./sha256";

// The browser half of an upload: sniff the header row from the first bytes, let the operator
// confirm roles, hash, register, PUT straight to storage, complete. The server checks it all again.

const SNIFF_BYTES = 64 * 1024;

export type FilePhase = "ready" | "hashing" | "uploading" | "completing" | "sent" | "error";

export type FileEntry = {
  key: string;
  file: File;
  channels: string[];
  roles: Record<string, ChannelRole>;
  scales: Record<string, string>;
  phase: FilePhase;
  fraction: number;
  message: string | null;
  captureId: string | null;
  duplicate: boolean;
  firstState: string | null;
};

export type BatchMeta = Omit<CaptureRegistration, "channelRoles" | "probeScales" | "fileName" | "sizeBytes" | "sha256">;

const mib = (bytes: number) => `${(bytes / 1024 ** 2).toFixed(1)} MiB`;

async function describeFile(file: File, maxBytes: number): Promise<Pick<FileEntry, "channels" | "roles" | "phase" | "message">> {
  const refuse = (message: string) => ({ channels: [], roles: {}, phase: "error" as const, message });
  if (!CAPTURE_FILE_NAME.test(file.name)) return refuse("Only CSV exports are accepted (.csv, .txt or .tsv)");
  if (file.size === 0) return refuse("The file is empty");
  if (file.size > maxBytes) return refuse(`The file is ${mib(file.size)}: the limit is ${mib(maxBytes)}`);
  try {
    const sniffed = sniffCaptureBytes(new Uint8Array(await file.slice(0, SNIFF_BYTES).arrayBuffer()));
    return { channels: Object.keys(sniffed.suggestedRoles), roles: sniffed.suggestedRoles, phase: "ready", message: null };
  } catch (err) {
    return refuse(err instanceof Error ? err.message : "The header row could not be read");
  }
}

export function useUploadQueue(maxBytes: number) {
  const [entries, setEntries] = useState<FileEntry[]>([]);
  const patch = useCallback((key: string, change: Partial<FileEntry>) => {
    setEntries((list) => list.map((e) => (e.key === key ? { ...e, ...change } : e)));
  }, []);

  const addFiles = useCallback(async (files: File[]) => {
    const described = await Promise.all(
      files.map(async (file, i) => ({
        key: `${file.name}-${file.size}-${file.lastModified}-${Date.now()}-${i}`, file, scales: {}, fraction: 0, captureId: null,
        duplicate: false, firstState: null, ...(await describeFile(file, maxBytes)),
      })),
    );
    setEntries((list) => [...list, ...described]);
  }, [maxBytes]);

  const remove = useCallback((key: string) => setEntries((list) => list.filter((e) => e.key !== key)), []);

  const uploadOne = useCallback(async (entry: FileEntry, meta: BatchMeta) => {
    try {
      const probeScales = Object.fromEntries(
        Object.entries(entry.scales).filter(([, v]) => v.trim() !== "").map(([k, v]) => [k, Number(v)]),
      );
      patch(entry.key, { phase: "hashing", fraction: 0, message: null });
      const sha256 = await sha256OfBlob(entry.file, (f) => patch(entry.key, { fraction: f }));
      const input = { ...meta, channelRoles: entry.roles, probeScales, fileName: entry.file.name, sizeBytes: entry.file.size, sha256 };
      const parsed = captureRegistrationSchema.safeParse(input);
      if (!parsed.success) throw new Error(parsed.error.issues.map((i) => `${i.path.join(".") || "form"}: ${i.message}`).join("; "));
      const registered = await postRegistration(input);
      const id = registered.capture.id;
      patch(entry.key, { captureId: id, duplicate: registered.duplicate });
      if (!registered.upload) {
        patch(entry.key, { phase: "sent", fraction: 1, firstState: registered.capture.state, message: "Already uploaded: this is the existing capture" });
        return;
      }
      patch(entry.key, { phase: "uploading", fraction: 0 });
      const parts = await putCaptureObject(id, entry.file, registered.upload, (f) => patch(entry.key, { fraction: f }));
      patch(entry.key, { phase: "completing" });
      const completed = await postComplete(id, parts);
      patch(entry.key, { phase: "sent", fraction: 1, firstState: completed.state });
    } catch (err) {
      patch(entry.key, { phase: "error", message: err instanceof Error ? err.message : String(err) });
    }
  }, [patch]);

  /** Files go one after another: the bench link is usually the bottleneck, and order stays readable. */
  const uploadAll = useCallback(async (meta: BatchMeta) => {
    for (const entry of entries.filter((e) => e.phase === "ready")) await uploadOne(entry, meta);
  }, [entries, uploadOne]);

  return { entries, addFiles, remove, patch, uploadAll };
}
