import { TEST_KIND_LABELS } from "@/lib/captures/input-schemas";
import type { CaptureStatusView } from "@/lib/dal/captures";
import { fmtDate } from "./format";

/** What was captured and how: test, speed, bench, who, roles, probe ratios, size and checksum. */
export function CaptureDetails({ capture: c }: { capture: CaptureStatusView }) {
  const roles = Object.entries(c.channelRoles);
  const scales = Object.entries(c.probeScales).map(([k, v]) => `${k} ×${v}`).concat(Object.entries(c.channelOffsets).map(([k, v]) => `${k} ${v >= 0 ? "+" : ""}${v}`));
  return (
    <dl className="grid grid-cols-2 gap-4 rounded-lg bg-white p-5 text-sm shadow-sm ring-1 ring-ink-200 md:grid-cols-4">
      <div><dt className="text-ink-600">Test</dt><dd className="mt-1 font-semibold">{TEST_KIND_LABELS[c.testKind as keyof typeof TEST_KIND_LABELS] ?? c.testKind}</dd></div>
      <div><dt className="text-ink-600">Shaft speed</dt><dd className="mt-1">{c.speedRpm ? `${c.speedRpm} rpm` : "—"}</dd></div>
      <div><dt className="text-ink-600">Bench</dt><dd className="mt-1">{c.stationName ?? "—"}</dd></div>
      <div><dt className="text-ink-600">Uploaded</dt><dd className="mt-1">{fmtDate(c.uploadedAt ?? c.createdAt)}{c.uploadedBy ? ` by ${c.uploadedBy}` : ""}</dd></div>
      <div className="col-span-2"><dt className="text-ink-600">Channel roles</dt><dd className="mt-1 break-words font-mono text-xs">{roles.length ? roles.map(([k, v]) => `${k} → ${v}`).join(" · ") : "from the headers"}</dd></div>
      <div className="col-span-2"><dt className="text-ink-600">Probe ratios and offsets</dt><dd className="mt-1 break-words font-mono text-xs">{scales.length ? scales.join(" · ") : "none entered (×1)"}</dd></div>
      <div><dt className="text-ink-600">Size</dt><dd className="mt-1 tabular-nums">{(c.sizeBytes / 1024 ** 2).toFixed(2)} MiB</dd></div>
      <div><dt className="text-ink-600">sha256</dt><dd className="mt-1 truncate font-mono text-xs" title={c.sha256}>{c.sha256}</dd></div>
      {c.notes ? <div className="col-span-full"><dt className="text-ink-600">Notes</dt><dd className="mt-1 whitespace-pre-wrap">{c.notes}</dd></div> : null}
    </dl>
  );
}
