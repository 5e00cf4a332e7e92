import { notFound } from "next/navigation";
import { RatingForm } from "@/components/ratings/rating-form";
import { PageHeader } from "@/components/shell/page-header";
import { Notice } from "@/components/ui/notice";
import { HttpError } from "@/lib/auth/guards";
import { requireRoleActor } from "@/lib/dal/actor";
import { getRatingPageView } from "@/lib/dal/rating-page";
import { rejudgeRatingAction, setRatingRetiredAction, updateRatingAction } from "../actions";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { PlanSection } from "./_components/plan-section";
import { ProfileSection } from "./_components/profile-section";

export const metadata = { title: "Rating" };

type Search = Record<string, string | string[] | undefined>;
const SAVED: Record<string, string> = { created: "Rating created with profile version 1.", nameplate: "Nameplate saved.", profile: "New profile version saved.", plan: "Test plan saved; the units' plan states were recomputed." };

export default async function RatingPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<Search> }) {
  const actor = await requireRoleActor("admin", "operator", "qa");
  const [{ id }, search] = await Promise.all([params, searchParams]);
  const saved = typeof search.saved === "string" ? SAVED[search.saved] : undefined;
  let view;
  try {
    view = await getRatingPageView(actor, id, { withAffected: Boolean(saved) && search.saved !== "created" });
  } catch (err) {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  }
  const { rating } = view;
  const offerRejudge = view.canEdit && saved && search.saved !== "created" && view.affectedCaptures > 0;
  return (
    <>
      <PageHeader title={`${rating.modelCode} — ${rating.title}`} lead={`${rating.client} · ${rating.machineKindLabel}${rating.retiredAt ? ` · retired ${rating.retiredAt.toISOString().slice(0, 10)}: no new units` : ""}`} />
      {saved ? <div className="mb-4"><Notice kind="done">{saved}</Notice></div> : null}
      {typeof search.rejudged === "string" ? (
        <div className="mb-4"><Notice kind="done" title="Re-judged">{search.rejudged} capture(s) re-judged against the profile in force; {String(search.unchanged ?? 0)} already were. Earlier judgements stay in each capture&apos;s history.</Notice></div>
      ) : null}
      {offerRejudge ? (
        <div className="mb-4">
          <Notice kind="caution" title="Judged captures may now read differently">
            <p>{view.affectedCaptures} analysed capture(s) of this rating were judged before this change.</p>
            <form action={rejudgeRatingAction} className="mt-2">
              <input type="hidden" name="ratingId" value={rating.id} />
              <button type="submit" className="rounded-md bg-copper-600 px-3 py-1.5 text-sm font-semibold text-white">Re-judge {view.affectedCaptures} capture(s)</button>
            </form>
          </Notice>
        </div>
      ) : null}
      <section aria-label="Nameplate">
        <h2 className="mb-3 text-lg font-semibold">Nameplate</h2>
        <dl className="grid gap-x-6 gap-y-2 rounded-lg bg-white p-5 text-sm shadow-sm ring-1 ring-ink-200 md:grid-cols-3">
          {rating.nameplateRows.map((r) => <div key={r.label}><dt className="text-ink-600">{r.label}</dt><dd className="font-semibold">{r.value}</dd></div>)}
        </dl>
        {view.canEdit && view.nameplate ? (
          <div className="mt-3 flex flex-wrap items-start gap-6">
            <details className="w-full">
              <summary className="cursor-pointer text-sm font-semibold text-copper-700">Edit nameplate</summary>
              <div className="mt-3"><RatingForm action={updateRatingAction} rating={{ id: rating.id, modelCode: rating.modelCode, title: rating.title, nameplate: view.nameplate }} /></div>
            </details>
            <form action={setRatingRetiredAction}>
              <input type="hidden" name="ratingId" value={rating.id} />
              <input type="hidden" name="retired" value={rating.retiredAt ? "false" : "true"} />
              {rating.retiredAt ? <button type="submit" className="text-sm font-semibold text-outside-700">Bring back into use</button> : (
                <ConfirmButton label="Retire rating" question="Retire this rating? No new units can be registered against it; its units and captures stay." confirmLabel="Yes, retire it" />
              )}
            </form>
          </div>
        ) : null}
      </section>
      <ProfileSection ratingId={rating.id} inForce={view.inForce} versions={view.versions} canEdit={view.canEdit && !rating.retiredAt} />
      <PlanSection ratingId={rating.id} steps={view.plan} canEdit={view.canEdit} judgedChecks={view.judgedChecks} ratedSpeedRpm={view.nameplate?.ratedSpeedRpm ?? 1500} retired={Boolean(rating.retiredAt)} />
    </>
  );
}
