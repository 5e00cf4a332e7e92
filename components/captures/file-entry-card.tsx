"use client";

import { CHANNEL_ROLES, type ChannelRole } from "@/lib/analysis";
import { ProgressBar } from "./capture-state-badge";
import { ApplySettings } from "./apply-settings";
import { LiveCaptureState } from "./live-capture-state";
import type { FileEntry } from "./use-upload-queue";

export const ROLE_LABELS: Record<ChannelRole, string> = {
  v: "Single voltage", van: "Phase A–N", vbn: "Phase B–N", vcn: "Phase C–N",
  vab: "Line A–B", vbc: "Line B–C", vca: "Line C–A", ia: "Current A", ib: "Current B", ic: "Current C",
};

const PHASE_LABEL: Record<FileEntry["phase"], string> = {
  ready: "Ready", hashing: "Checking file", uploading: "Uploading", completing: "Finishing upload", sent: "Uploaded", error: "Not uploaded",
};

const mib = (bytes: number) => `${(bytes / 1024 ** 2).toFixed(bytes < 1024 ** 2 ? 2 : 1)} MiB`;

/** One file of the batch: confirm each channel's role and probe scale, then watch it upload and analyse. */
export function FileEntryCard({ entry, onChange, onRemove }: {
  entry: FileEntry;
  onChange: (change: Partial<FileEntry>) => void;
  onRemove: () => void;
}) {
  const editable = entry.phase === "ready";
  return (
    <li data-testid="upload-file" data-file={entry.file.name} className="rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="font-mono text-sm font-semibold">{entry.file.name} <span className="font-sans font-normal text-ink-600">· {mib(entry.file.size)}</span></p>
        <div className="flex items-center gap-3 text-xs">
          <span data-testid="upload-phase">{PHASE_LABEL[entry.phase]}</span>
          {editable || entry.phase === "error" ? <button type="button" onClick={onRemove} className="font-semibold text-outside-700">Remove</button> : null}
        </div>
      </div>
      {entry.channels.length > 0 ? (
        <table className="mt-3 w-full text-sm">
          <thead className="text-left text-xs uppercase tracking-wide text-ink-600">
            <tr><th className="py-1 pr-3">Column</th><th className="py-1 pr-3">Role</th><th className="py-1 pr-3">Probe scale ×</th><th className="py-1">Offset (V or A)</th></tr>
          </thead>
          <tbody>
            {entry.channels.map((ch) => (
              <tr key={ch} className="border-t border-ink-100">
                <td className="py-1 pr-3 font-mono">{ch}</td>
                <td className="py-1 pr-3">
                  <select aria-label={`Role of ${ch}`} disabled={!editable} value={entry.roles[ch] ?? "v"}
                    onChange={(e) => onChange({ roles: { ...entry.roles, [ch]: e.target.value as ChannelRole } })}
                    className="rounded border border-ink-200 px-2 py-1">
                    {CHANNEL_ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
                  </select>
                </td>
                <td className="py-1 pr-3">
                  <input aria-label={`Probe scale of ${ch}`} disabled={!editable} inputMode="decimal" placeholder="1"
                    value={entry.scales[ch] ?? ""} onChange={(e) => onChange({ scales: { ...entry.scales, [ch]: e.target.value } })}
                    className="w-24 rounded border border-ink-200 px-2 py-1" />
                </td>
                <td className="py-1">
                  <input aria-label={`Offset of ${ch}`} disabled={!editable} inputMode="decimal" placeholder="0"
                    value={entry.offsets[ch] ?? ""} onChange={(e) => onChange({ offsets: { ...entry.offsets, [ch]: e.target.value } })}
                    className="w-24 rounded border border-ink-200 px-2 py-1" />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
      {entry.needsRate ? (
        <label className="mt-2 flex items-center gap-2 text-sm">
          <span>Sample rate (Hz): the file gives no time base</span>
          <input aria-label="Sample rate in Hz" disabled={!editable} inputMode="decimal" value={entry.sampleRate}
            onChange={(e) => onChange({ sampleRate: e.target.value })} className="w-32 rounded border border-ink-200 px-2 py-1" />
        </label>
      ) : null}
      {entry.profileNote ? <p data-testid="import-profile-note" className="mt-2 text-xs text-ink-600">{entry.profileNote}</p> : null}
      {entry.phase === "hashing" ? <ProgressBar fraction={entry.fraction} label="Checking file" /> : null}
      {entry.phase === "uploading" || entry.phase === "completing" || entry.phase === "sent" ? <ProgressBar fraction={entry.fraction} label="Upload" /> : null}
      {entry.message ? (
        <p role={entry.phase === "error" ? "status" : undefined} className={`mt-2 text-sm ${entry.phase === "error" ? "font-semibold text-outside-700" : "text-ink-600"}`}>
          {entry.message}
        </p>
      ) : null}
      {entry.captureId && entry.settingsDiffer ? <ApplySettings captureId={entry.captureId} differ={entry.settingsDiffer} /> : null}
      {entry.captureId && entry.phase === "sent" ? <LiveCaptureState captureId={entry.captureId} firstState={entry.firstState} /> : null}
    </li>
  );
}
