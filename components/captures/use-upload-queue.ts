"use client";

import { useCallback, useState } from "react";
import { sniffCaptureBytes, type ChannelRole } from "@/lib/analysis";
import { CAPTURE_FILE_NAME, captureRegistrationSchema, type CaptureRegistration } from "@/lib/captures/input-schemas";
import { postComplete, postRegistration } from "./fetchers";
import { fetchPrefill, signatureOf } from "./import-profile-prefill";
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
  offsets: Record<string, string>;
  /** Hz, for a file with no time column or a sample-index column without a stated rate. */
  sampleRate: string;
  needsRate: boolean;
  signature: string | null;
  profileNote: string | null;
  phase: FilePhase;
  fraction: number;
  message: string | null;
  captureId: string | null;
  duplicate: boolean;
  /** The file was stored already, with other settings: { field: [stored, sent] }. */
  settingsDiffer: Record<string, [unknown, unknown]> | null;
  firstState: string | null;
};

export type BatchMeta = Omit<CaptureRegistration, "channelRoles" | "probeScales" | "fileName" | "sizeBytes" | "sha256">;

const mib = (bytes: number) => `${(bytes / 1024 ** 2).toFixed(1)} MiB`;

type Described = Pick<FileEntry, "channels" | "roles" | "phase" | "message" | "needsRate" | "signature">;

async function describeFile(file: File, maxBytes: number): Promise<Described> {
  const refuse = (message: string) => ({ channels: [], roles: {}, phase: "error" as const, message, needsRate: false, signature: null });
  if (!CAPTURE_FILE_NAME.test(file.name)) return refuse("Only CSV exports are accepted (.csv, .txt or .tsv)");
  if (file.size === 0) return refuse("The file is empty");
  if (file.size > maxBytes) return refuse(`The file is ${mib(file.size)}: the limit is ${mib(maxBytes)}`);
  try {
    const sniffed = sniffCaptureBytes(new Uint8Array(await file.slice(0, SNIFF_BYTES).arrayBuffer()));
    const needsRate = sniffed.timeColumn === null || (sniffed.timeIsIndex && sniffed.statedSampleRateHz === null);
    return { channels: Object.keys(sniffed.suggestedRoles), roles: sniffed.suggestedRoles, phase: "ready", message: null, needsRate, signature: signatureOf(sniffed) };
  } catch (err) {
    return refuse(err instanceof Error ? err.message : "The header row could not be read");
  }
}

export function useUploadQueue(maxBytes: number) {
  const [entries, setEntries] = useState<FileEntry[]>([]);
  const patch = useCallback((key: string, change: Partial<FileEntry>) => {
    setEntries((list) => list.map((e) => (e.key === key ? { ...e, ...change } : e)));
  }, []);

  const addFiles = useCallback(async (files: File[], stationId?: string) => {
    const described = await Promise.all(
      files.map(async (file, i): Promise<FileEntry> => {
        const entry: FileEntry = {
          key: `${file.name}-${file.size}-${file.lastModified}-${Date.now()}-${i}`, file, scales: {}, offsets: {}, sampleRate: "", profileNote: null,
          fraction: 0, captureId: null, duplicate: false, settingsDiffer: null, firstState: null, ...(await describeFile(file, maxBytes)),
        };
        const prefill = stationId && entry.signature && entry.phase === "ready" ? await fetchPrefill(stationId, entry.signature, entry.channels, entry.roles) : null;
        return prefill ? { ...entry, ...prefill } : entry;
      }),
    );
    setEntries((list) => [...list, ...described]);
  }, [maxBytes]);

  const remove = useCallback((key: string) => setEntries((list) => list.filter((e) => e.key !== key)), []);

  const uploadOne = useCallback(async (entry: FileEntry, meta: BatchMeta) => {
    try {
      const numbers = (record: Record<string, string>) => Object.fromEntries(Object.entries(record).filter(([, v]) => v.trim() !== "").map(([k, v]) => [k, Number(v)]));
      const probeScales = numbers(entry.scales);
      const channelOffsets = numbers(entry.offsets);
      const sampleRateHz = entry.sampleRate.trim() !== "" ? Number(entry.sampleRate) : null;
      patch(entry.key, { phase: "hashing", fraction: 0, message: null });
      const sha256 = await sha256OfBlob(entry.file, (f) => patch(entry.key, { fraction: f }));
      const input = { ...meta, channelRoles: entry.roles, probeScales, channelOffsets, sampleRateHz, fileName: entry.file.name, sizeBytes: entry.file.size, sha256 };
      const parsed = captureRegistrationSchema.safeParse(input);
      if (!parsed.success) throw new Error(parsed.error.issues.map((i) => `${i.path.join(".") || "form"}: ${i.message}`).join("; "));
      const registered = await postRegistration(input);
      const id = registered.capture.id;
      patch(entry.key, { captureId: id, duplicate: registered.duplicate, settingsDiffer: registered.settingsDiffer ?? null });
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
