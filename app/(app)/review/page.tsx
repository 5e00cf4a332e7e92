import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { requireRoleActor } from "@/lib/dal/actor";
import { getReviewQueueView, REVIEW_COUNT_CAP, reviewPageSchema } from "@/lib/dal/review";
import { ReviewQueue } from "./_components/review-queue";

export const metadata = { title: "Review queue" };

export default async function ReviewPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const page = reviewPageSchema.parse((await searchParams).page);
  const view = await getReviewQueueView(await requireRoleActor("qa", "admin"), page);
  const waiting = view.waitingCapped ? `More than ${REVIEW_COUNT_CAP.toLocaleString("en-GB")}` : view.waiting.toLocaleString("en-GB");
  return (
    <>
      <PageHeader
        title="Review queue"
        lead="Open units with a judged capture, waiting for a disposition: outside tolerance first, then inconclusive, then near an edge; within each, the oldest capture first."
      />
      {view.units.length === 0 ? (
        <EmptyState title="Nothing waits for review">Every judged unit has a disposition.</EmptyState>
      ) : (
        <>
          <p className="mb-2 text-sm text-ink-600">{waiting} units waiting · page {view.page}</p>
          <ReviewQueue units={view.units} reviewers={view.reviewers} />
        </>
      )}
      {view.page > 1 || view.hasMore ? (
        <nav aria-label="Pages" className="mt-4 flex gap-4 text-sm">
          {view.page > 1 ? <Link href={view.page === 2 ? "/review" : `/review?page=${view.page - 1}`}>← Previous</Link> : null}
          {view.hasMore ? <Link href={`/review?page=${view.page + 1}`}>Next →</Link> : null}
        </nav>
      ) : null}
    </>
  );
}
