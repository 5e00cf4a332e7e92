import Link from "next/link";
import { fmt, fmtFixed, fmtWithUnit } from "@/components/captures/format";
import { StatusTag } from "@/components/ui/status-tag";
import type { KeFit, PlanState, StepStatus } from "@/lib/analysis";
import type { ReactNode } from "react";

export const PLAN_STATE_WORDS: Record<PlanState, string> = {
  "complete-within": "Complete and within tolerance",
  incomplete: "Incomplete: steps missing",
  failed: "Failed: a plan step is not within tolerance",
  inconclusive: "Inconclusive: a step could not be judged",
};

const STEP_STYLE: Record<StepStatus, { cls: string; mark: string; word: string }> = {
  passed: { cls: "bg-within-100 text-within-700", mark: "●", word: "Passed" },
  failed: { cls: "bg-outside-100 text-outside-700", mark: "▲", word: "Failed" },
  inconclusive: { cls: "bg-ink-100 text-ink-900 ring-1 ring-ink-600", mark: "?", word: "Inconclusive" },
  missing: { cls: "bg-ink-100 text-ink-600", mark: "○", word: "Missing" },
};

export function StepStatusTag({ status }: { status: StepStatus }) {
  const s = STEP_STYLE[status];
  return <span className={`inline-flex items-center gap-1 rounded px-2 py-0.5 text-xs font-semibold ${s.cls}`}><span aria-hidden>{s.mark}</span>{s.word}</span>;
}

type Step = {
  id: string; name: string; testKind: string; speedMinRpm: number; speedMaxRpm: number; checks: string[]; status: StepStatus; chosen: boolean;
  record: { id: string; name: string; overall: Parameters<typeof StatusTag>[0]["status"]; createdAt: string; speedRpm: number | null } | null;
};

/** The unit against its rating's test plan: each step's status and capture of record, then Ke across speeds. */
export function PlanPanel({ state, steps, keFit, renderChoice }: { state: PlanState; steps: Step[]; keFit: KeFit | null; renderChoice?: (step: Step) => ReactNode }) {
  return (
    <section aria-labelledby="plan" className="mt-6 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200">
      <h2 id="plan" className="font-semibold">Test plan</h2>
      <p className="mt-1 text-sm" data-testid="plan-state"><strong>{PLAN_STATE_WORDS[state]}</strong></p>
      {steps.length === 0 ? <p className="mt-2 text-sm text-ink-600">The rating has no test plan yet, so no unit of it can be complete.</p> : null}
      <ol className="mt-3 space-y-3">
        {steps.map((s) => (
          <li key={s.id} className="rounded-md border border-ink-100 p-3 text-sm" data-testid="plan-step">
            <div className="flex flex-wrap items-center gap-2">
              <StepStatusTag status={s.status} />
              <span className="font-semibold">{s.name}</span>
              <span className="text-xs text-ink-600">{s.testKind} · {fmt(s.speedMinRpm, 5)}–{fmt(s.speedMaxRpm, 5)} rpm</span>
            </div>
            <p className="mt-1 text-xs text-ink-600">Checks: {s.checks.join(", ")}</p>
            {s.record ? (
              <p className="mt-1 text-xs">
                Capture of record{s.chosen ? " (chosen by a quality engineer)" : " (the latest)"}: <Link href={`/captures/${s.record.id}`} className="font-mono">{s.record.name}</Link> at {s.record.speedRpm ?? "—"} rpm · <StatusTag status={s.record.overall} />
              </p>
            ) : <p className="mt-1 text-xs text-ink-600">No capture judged for this step yet.</p>}
            {renderChoice?.(s)}
          </li>
        ))}
      </ol>
      {keFit ? (
        <div className="mt-4 rounded-md bg-ink-100 p-3 text-sm" data-testid="ke-fit">
          <p className="font-semibold">Back-EMF constant across speeds</p>
          <p className="mt-1">
            Ke = <span className="tabular-nums">{fmtWithUnit(keFit.ke, keFit.unit, 5)}</span> (least squares through the origin over {keFit.points.length} speed{keFit.points.length === 1 ? "" : "s"}) ·
            linearity {keFit.linearityPercent === null ? "—" : `${fmtFixed(keFit.linearityPercent, 2)} %`} · limits {fmtWithUnit(keFit.lower, keFit.unit, 5)} … {fmtWithUnit(keFit.upper, keFit.unit, 5)} · <StatusTag status={keFit.status} />
          </p>
          <p className="mt-1 text-xs text-ink-600">Limit: {keFit.source}</p>
        </div>
      ) : null}
    </section>
  );
}
