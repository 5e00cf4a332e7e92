import { PlanStepForm } from "@/components/ratings/plan-step-form";
import { ConfirmButton } from "@/components/ui/confirm-button";
import type { CheckId } from "@/lib/analysis";
import { movePlanStepAction, retirePlanStepAction, savePlanStepAction } from "../../actions";

type Step = { id: string; name: string; testKindLabel: string; testKind: string; speedWindow: string; speedMinRpm: number; speedMaxRpm: number; requiredRoles: string[]; requiredRoleLabels: string[]; checks: string[]; checkLabels: string[] };

function StepButton({ action, ratingId, stepId, label, extra, confirm }: { action: (f: FormData) => Promise<void>; ratingId: string; stepId: string; label: string; extra?: Record<string, string>; confirm?: string }) {
  return (
    <form action={action} className="inline">
      <input type="hidden" name="ratingId" value={ratingId} />
      <input type="hidden" name="stepId" value={stepId} />
      {Object.entries(extra ?? {}).map(([k, v]) => <input key={k} type="hidden" name={k} value={v} />)}
      {confirm ? <ConfirmButton label={label} question={confirm} confirmLabel={`Yes, ${label.toLowerCase()}`} /> : <button type="submit" className="text-sm font-semibold text-copper-700">{label}</button>}
    </form>
  );
}

/** The active plan in order, with edit, move and retire for editors. */
export function PlanSection({ ratingId, steps, canEdit, judgedChecks, ratedSpeedRpm, retired }: { ratingId: string; steps: Step[]; canEdit: boolean; judgedChecks: CheckId[]; ratedSpeedRpm: number; retired: boolean }) {
  const editable = canEdit && !retired;
  return (
    <section className="mt-8" aria-label="Test plan">
      <h2 className="mb-3 text-lg font-semibold">Test plan</h2>
      {steps.length === 0 ? <p className="text-sm text-ink-600">No steps yet: a unit of this rating cannot be complete.</p> : (
        <ol className="space-y-3">
          {steps.map((s, i) => (
            <li key={s.id} className="rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200" aria-label={`Step ${i + 1}: ${s.name}`}>
              <p className="font-semibold">{i + 1}. {s.name}</p>
              <p className="text-sm text-ink-600">{s.testKindLabel} · {s.speedWindow} · roles: {s.requiredRoleLabels.join(", ") || "any"}</p>
              <p className="text-sm text-ink-600">Checks: {s.checkLabels.join(", ")}</p>
              {editable ? (
                <div className="mt-2 flex flex-wrap gap-4">
                  {i > 0 ? <StepButton action={movePlanStepAction} ratingId={ratingId} stepId={s.id} label="Move up" extra={{ by: "-1" }} /> : null}
                  {i < steps.length - 1 ? <StepButton action={movePlanStepAction} ratingId={ratingId} stepId={s.id} label="Move down" extra={{ by: "1" }} /> : null}
                  <StepButton action={retirePlanStepAction} ratingId={ratingId} stepId={s.id} label="Retire step" confirm={`Retire step “${s.name}”? Units of this rating no longer need it; its captures stay.`} />
                  <details className="w-full">
                    <summary className="cursor-pointer text-sm font-semibold text-copper-700">Edit step</summary>
                    <div className="mt-3"><PlanStepForm action={savePlanStepAction} ratingId={ratingId} judgedChecks={judgedChecks} ratedSpeedRpm={ratedSpeedRpm} step={s} /></div>
                  </details>
                </div>
              ) : null}
            </li>
          ))}
        </ol>
      )}
      {editable ? (
        <div className="mt-4 rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200">
          <h3 className="mb-3 font-semibold">Add a step</h3>
          <PlanStepForm action={savePlanStepAction} ratingId={ratingId} judgedChecks={judgedChecks} ratedSpeedRpm={ratedSpeedRpm} />
        </div>
      ) : null}
    </section>
  );
}
