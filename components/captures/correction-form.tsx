"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { CHANNEL_ROLES } from "@/lib/analysis";
import { TEST_KIND_LABELS, TEST_KINDS } from "@/lib/captures/input-schemas";
import type { CaptureStatusView } from "@/lib/dal/captures";
import { captureKeys, patchCapture } from "./fetchers";

type Props = { capture: CaptureStatusView; channels: string[]; planSteps: { id: string; name: string }[] };
type Row = { role: string; scale: string; offset: string };

const num = (text: string): number | undefined => (text.trim() === "" ? undefined : Number(text.replace(",", ".")));

/** Corrects roles, probe ratios, offsets, speed, test kind or plan step after upload; the capture is analysed again. */
export function CorrectionForm({ capture: c, channels, planSteps }: Props) {
  const router = useRouter();
  const client = useQueryClient();
  const [open, setOpen] = useState(false);
  const [rows, setRows] = useState<Record<string, Row>>(() =>
    Object.fromEntries(channels.map((id) => [id, { role: c.channelRoles[id] ?? "", scale: String(c.probeScales[id] ?? 1), offset: String(c.channelOffsets[id] ?? 0) }])),
  );
  const [speed, setSpeed] = useState(c.speedRpm === null ? "" : String(c.speedRpm));
  const [testKind, setTestKind] = useState(c.testKind);
  const [stepId, setStepId] = useState(c.planStepId ?? "");
  const [reason, setReason] = useState("");
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  if (!open) return <Button type="button" tone="quiet" onClick={() => setOpen(true)}>Correct settings…</Button>;

  const onSubmit = async (e: FormEvent) => {
    e.preventDefault();
    const channelRoles: Record<string, string> = {};
    const probeScales: Record<string, number> = {};
    const channelOffsets: Record<string, number> = {};
    for (const [id, row] of Object.entries(rows)) {
      if (row.role) channelRoles[id] = row.role;
      const scale = num(row.scale);
      const offset = num(row.offset);
      if (scale === undefined || !(scale > 0)) return setProblem(`Probe ratio of ${id} must be a positive number`);
      if (offset === undefined || !Number.isFinite(offset)) return setProblem(`Offset of ${id} must be a number (0 for none)`);
      if (scale !== 1) probeScales[id] = scale;
      if (offset !== 0) channelOffsets[id] = offset;
    }
    const speedRpm = num(speed);
    if (speedRpm !== undefined && !(speedRpm >= 1)) return setProblem("Shaft speed must be at least 1 rpm");
    setBusy(true);
    setProblem(null);
    try {
      await patchCapture(c.id, {
        channelRoles: channelRoles as never, probeScales, channelOffsets, speedRpm: speedRpm ?? null,
        testKind: testKind as (typeof TEST_KINDS)[number], planStepId: stepId || null, reason,
      });
      await client.invalidateQueries({ queryKey: captureKeys.status(c.id) });
      setOpen(false);
      router.refresh();
    } catch (err) {
      setProblem(err instanceof Error ? err.message : String(err));
    } finally {
      setBusy(false);
    }
  };

  return (
    <form onSubmit={onSubmit} className="space-y-4 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200" aria-label="Correct capture settings">
      <h2 className="font-semibold">Correct the settings</h2>
      <p className="text-xs text-ink-600">Saving records who, when and why, and analyses the file again with these settings. The current result stays in the history.</p>
      <div className="overflow-x-auto">
        <table className="min-w-full text-sm">
          <thead className="text-left text-xs text-ink-600"><tr><th className="py-1 pr-3">Column</th><th className="py-1 pr-3">Role</th><th className="py-1 pr-3">Probe ratio (×)</th><th className="py-1">Offset (V or A)</th></tr></thead>
          <tbody>
            {channels.map((id) => (
              <tr key={id}>
                <td className="py-1 pr-3 font-mono text-xs">{id}</td>
                <td className="py-1 pr-3">
                  <Select aria-label={`Role of ${id}`} value={rows[id]?.role ?? ""} onChange={(e) => setRows({ ...rows, [id]: { ...(rows[id] as Row), role: e.target.value } })}>
                    <option value="">from the header</option>
                    {CHANNEL_ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
                  </Select>
                </td>
                <td className="py-1 pr-3"><TextInput aria-label={`Probe ratio of ${id}`} inputMode="decimal" value={rows[id]?.scale ?? "1"} onChange={(e) => setRows({ ...rows, [id]: { ...(rows[id] as Row), scale: e.target.value } })} /></td>
                <td className="py-1"><TextInput aria-label={`Offset of ${id}`} inputMode="decimal" value={rows[id]?.offset ?? "0"} onChange={(e) => setRows({ ...rows, [id]: { ...(rows[id] as Row), offset: e.target.value } })} /></td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="grid gap-4 md:grid-cols-3">
        <Field label="Shaft speed (rpm)"><TextInput inputMode="decimal" value={speed} onChange={(e) => setSpeed(e.target.value)} /></Field>
        <Field label="Test">
          <Select value={testKind} onChange={(e) => setTestKind(e.target.value)}>{TEST_KINDS.map((k) => <option key={k} value={k}>{TEST_KIND_LABELS[k]}</option>)}</Select>
        </Field>
        <Field label="Plan step" hint="Matched from test and speed unless you pick one.">
          <Select value={stepId} onChange={(e) => setStepId(e.target.value)}>
            <option value="">Match from test and speed</option>
            {planSteps.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
          </Select>
        </Field>
      </div>
      <Field label="Why" hint="Kept with the capture's history, e.g. “100:1 probes were fitted, the scope was left at 1:1”.">
        <TextInput value={reason} onChange={(e) => setReason(e.target.value)} required minLength={5} maxLength={1000} />
      </Field>
      {problem ? <Notice kind="problem">{problem}</Notice> : null}
      <div className="flex gap-3">
        <Button type="submit" disabled={busy}>{busy ? "Saving…" : "Save and analyse again"}</Button>
        <Button type="button" tone="quiet" onClick={() => setOpen(false)}>Cancel</Button>
      </div>
    </form>
  );
}
