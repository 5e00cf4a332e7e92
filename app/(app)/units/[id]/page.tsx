import Link from "next/link";
import { notFound } from "next/navigation";
import { UnitCapturesTable } from "@/components/captures/unit-captures-table";
import { PageHeader } from "@/components/shell/page-header";
import { getUnitCaptureRows } from "@/lib/dal/captures";
import { getUnitHistoryView } from "@/lib/dal/review";
import { getUnitNotesView } from "@/lib/dal/unit-notes";
import { DISPOSITION_WORDS, whyNotWithin } from "@/lib/units/disposition-rules";
import { getUnitRatingChoices, getUnitView } from "@/lib/dal/units";
import { PLAN_STATE_WORDS, PlanPanel } from "@/components/units/plan-panel";
import { UnitSummary } from "@/components/units/unit-summary";
import { getUnitPlanView } from "@/lib/dal/unit-plan";
import { DispositionPanel } from "./_components/disposition-panel";
import { RecordChoice } from "./_components/record-choice";
import { UnitAdminPanel } from "./_components/unit-admin-panel";
import { UnitAttachments } from "./_components/unit-attachments";
import { UnitHistory } from "./_components/unit-history";
import { ReleasePanel } from "./_components/release-panel";
import { requirePageActor } from "@/lib/dal/actor";
import { UnitNotes } from "./_components/unit-notes";

/** Captures the unit page lists (newest first); the captures list, searched by serial, has them all. */
const UNIT_PAGE_CAPTURES = 50;
/** How many listCapturesForUnit reads at most. */
const UNIT_CAPTURES_READ = 200;

export default async function UnitPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const view = await getUnitView(id);
  // Another organisation's unit is indistinguishable from a missing one.
  if (!view) notFound();
  const { unit, rating, owner } = view;
  const [history, captureRows, plan, ratingChoices, actor, notes] = await Promise.all([
    getUnitHistoryView(unit.id), getUnitCaptureRows(unit.id), getUnitPlanView(unit.id), getUnitRatingChoices(), requirePageActor(), getUnitNotesView(unit.id),
  ]);
  // Drafts are the lab's own; a client reads released reports only.
  const isLab = actor.scope.kind === "lab";
  return (
    <>
      <PageHeader
        title={`Unit ${unit.serial}${unit.retiredAt ? " (retired)" : ""}`}
        lead={`${rating.modelCode} · ${rating.title} · ${owner}`}
        actions={
          <>
            {isLab ? <a href={`/api/units/${unit.id}/report.pdf`} className="rounded-md bg-copper-600 px-3 py-2 text-sm font-semibold text-white no-underline">Draft report (PDF)</a> : null}
            <a href={`/api/units/${unit.id}/report.csv`} className="rounded-md bg-white px-3 py-2 text-sm font-semibold no-underline ring-1 ring-ink-200">Verdicts (CSV)</a>
          </>
        }
      />
      <UnitSummary
        latestOverall={unit.latestOverall} planState={plan ? PLAN_STATE_WORDS[plan.state] : "—"} disposition={DISPOSITION_WORDS[unit.disposition]}
        registered={unit.createdAt.toISOString().slice(0, 10)} modelCode={rating.modelCode} nameplate={rating.nameplate}
      />
      {plan ? (
        <PlanPanel
          state={plan.state} steps={plan.steps} keFit={plan.keFit}
          renderChoice={plan.canChoose ? (s) => <RecordChoice unitId={unit.id} stepId={s.id} current={s.chosen ? s.record?.id ?? null : null} candidates={plan.steps.find((x) => x.id === s.id)?.candidates ?? []} /> : undefined}
        />
      ) : null}
      <section aria-labelledby="captures" className="mt-6 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200">
        <h2 id="captures" className="mb-3 font-semibold">Captures</h2>
        <UnitCapturesTable rows={captureRows.slice(0, UNIT_PAGE_CAPTURES)} />
        {captureRows.length > UNIT_PAGE_CAPTURES ? (
          <p className="mt-2 text-sm text-ink-600" data-testid="unit-captures-capped">
            The latest {UNIT_PAGE_CAPTURES} of {captureRows.length >= UNIT_CAPTURES_READ ? `at least ${UNIT_CAPTURES_READ}` : captureRows.length} captures. <Link href={`/captures?q=${encodeURIComponent(unit.serial)}`}>All of this unit&apos;s captures</Link>
          </p>
        ) : null}
      </section>
      <ReleasePanel unitId={unit.id} />
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
