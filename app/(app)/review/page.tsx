import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { StatusTag } from "@/components/ui/status-tag";
import { getReviewQueueView } from "@/lib/dal/review";

export const metadata = { title: "Review queue" };

export default async function ReviewPage() {
  const rows = await getReviewQueueView();
  return (
    <>
      <PageHeader title="Review queue" lead="Units whose latest capture has a check outside its band or near an edge, waiting for a disposition. Outside first, oldest first." />
      {rows.length === 0 ? (
        <EmptyState title="Nothing waits for review">Every unit outside tolerance has a disposition.</EmptyState>
      ) : (
        <ul className="divide-y divide-ink-100 rounded-lg bg-white shadow-sm ring-1 ring-ink-200">
          {rows.map((u) => (
            <li key={u.id} className="flex flex-wrap items-center gap-4 px-4 py-3">
              <StatusTag status={u.latestOverall} />
              <Link href={`/units/${u.id}`} className="font-mono font-semibold">{u.serial}</Link>
              <span className="text-sm text-ink-600">{u.modelCode} · {u.owner}</span>
              <span className="ml-auto text-xs text-ink-600">{u.latestCaptureAt ? `captured ${u.latestCaptureAt.toISOString().slice(0, 16).replace("T", " ")} UTC` : ""}</span>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
