import { notFound } from "next/navigation";
import { UnitCapturesTable } from "@/components/captures/unit-captures-table";
import { PageHeader } from "@/components/shell/page-header";
import { StatusTag } from "@/components/ui/status-tag";
import { getUnitCaptureRows } from "@/lib/dal/captures";
import { getUnitHistoryView } from "@/lib/dal/review";
import { getUnitNotesView } from "@/lib/dal/unit-notes";
import { DISPOSITION_WORDS, whyNotWithin } from "@/lib/units/disposition-rules";
import { getUnitRatingChoices, getUnitView } from "@/lib/dal/units";
import { PLAN_STATE_WORDS, PlanPanel } from "@/components/units/plan-panel";
import { getUnitPlanView } from "@/lib/dal/unit-plan";
import { DispositionPanel } from "./_components/disposition-panel";
import { RecordChoice } from "./_components/record-choice";
import { UnitAdminPanel } from "./_components/unit-admin-panel";
import { UnitAttachments } from "./_components/unit-attachments";
import { UnitHistory } from "./_components/unit-history";
import { UnitNotes } from "./_components/unit-notes";

export default async function UnitPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const view = await getUnitView(id);
  // Another organisation's unit is indistinguishable from a missing one.
  if (!view) notFound();
  const { unit, rating, owner } = view;
  const [history, captureRows, plan, ratingChoices, notes] = await Promise.all([
    getUnitHistoryView(unit.id), getUnitCaptureRows(unit.id), getUnitPlanView(unit.id), getUnitRatingChoices(), getUnitNotesView(unit.id),
  ]);
  return (
    <>
      <PageHeader
        title={`Unit ${unit.serial}${unit.retiredAt ? " (retired)" : ""}`}
        lead={`${rating.modelCode} · ${rating.title} · ${owner}`}
        actions={
          <>
            <a href={`/api/units/${unit.id}/report.pdf`} className="rounded-md bg-copper-600 px-3 py-2 text-sm font-semibold text-white no-underline">Test record (PDF)</a>
            <a href={`/api/units/${unit.id}/report.csv`} className="rounded-md bg-white px-3 py-2 text-sm font-semibold no-underline ring-1 ring-ink-200">Verdicts (CSV)</a>
          </>
        }
      />
      <dl className="grid grid-cols-2 gap-4 rounded-lg bg-white p-5 text-sm shadow-sm ring-1 ring-ink-200 md:grid-cols-4">
        <div><dt className="text-ink-600">Latest verdict</dt><dd className="mt-1"><StatusTag status={unit.latestOverall} /></dd></div>
        <div><dt className="text-ink-600">Test plan</dt><dd className="mt-1 font-semibold">{plan ? PLAN_STATE_WORDS[plan.state] : "—"}</dd></div>
        <div><dt className="text-ink-600">Disposition</dt><dd className="mt-1 font-semibold" data-testid="unit-disposition">{DISPOSITION_WORDS[unit.disposition]}</dd></div>
        <div><dt className="text-ink-600">Registered</dt><dd className="mt-1">{unit.createdAt.toISOString().slice(0, 10)}</dd></div>
        <div><dt className="text-ink-600">Model</dt><dd className="mt-1 font-mono">{rating.modelCode}</dd></div>
      </dl>
      {plan ? (
        <PlanPanel
          state={plan.state} steps={plan.steps} keFit={plan.keFit}
          renderChoice={plan.canChoose ? (s) => <RecordChoice unitId={unit.id} stepId={s.id} current={s.chosen ? s.record?.id ?? null : null} candidates={plan.steps.find((x) => x.id === s.id)?.candidates ?? []} /> : undefined}
        />
      ) : null}
      <section aria-labelledby="captures" className="mt-6 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200">
        <h2 id="captures" className="mb-3 font-semibold">Captures</h2>
        <UnitCapturesTable rows={captureRows} />
      </section>
      <UnitAttachments unitId={unit.id} />
      {history.canDisposition && ratingChoices.length > 0 ? (
        <UnitAdminPanel unitId={unit.id} serial={unit.serial} ratingId={unit.ratingId} retired={unit.retiredAt !== null} ratings={ratingChoices} />
      ) : null}
      <section aria-labelledby="decisions" className="mt-6 grid gap-6 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200 md:grid-cols-2">
        <div>
          <h2 id="decisions" className="mb-3 font-semibold">Decisions</h2>
          <UnitHistory events={history.events} />
        </div>
        {history.canDisposition ? <DispositionPanel unitId={unit.id} current={unit.disposition} withinNote={whyNotWithin(unit)} /> : null}
      </section>
      <UnitNotes unitId={unit.id} notes={notes.notes} clientNotes={notes.clientNotes} canWrite={notes.canWrite} />
    </>
  );
}
