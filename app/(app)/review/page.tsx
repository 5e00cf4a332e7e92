import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { requireRoleActor } from "@/lib/dal/actor";
import { getReviewQueueView } from "@/lib/dal/review";
import { ReviewQueue } from "./_components/review-queue";

export const metadata = { title: "Review queue" };

export default async function ReviewPage() {
  const view = await getReviewQueueView(await requireRoleActor("qa", "admin"));
  return (
    <>
      <PageHeader
        title="Review queue"
        lead="Open units with a judged capture, waiting for a disposition: outside tolerance first, then inconclusive, then near an edge; within each, the oldest capture first."
      />
      {view.units.length === 0 ? (
        <EmptyState title="Nothing waits for review">Every judged unit has a disposition.</EmptyState>
      ) : (
        <ReviewQueue units={view.units} reviewers={view.reviewers} />
      )}
    </>
  );
}
