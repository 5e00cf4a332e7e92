import "server-only";
import { listCapturePage } from "@/db/queries/capture-list";
import type { CaptureListQuery } from "@/lib/captures/list-query";
import type { Actor } from "./actor";

export const CAPTURE_PAGE_SIZE = 50;

/** One page of captures for the actor's scope, newest first unless sorted on a figure. */
export async function getCaptureListView(actor: Actor, query: CaptureListQuery) {
  const rows = await listCapturePage(actor.scope, {
    search: query.q || undefined, state: query.state, overall: query.overall, testKind: query.kind,
    sort: query.sort, dir: query.dir, limit: CAPTURE_PAGE_SIZE + 1, offset: (query.page - 1) * CAPTURE_PAGE_SIZE,
  });
  return {
    rows: rows.slice(0, CAPTURE_PAGE_SIZE).map((r) => ({ ...r, createdAt: r.createdAt.toISOString() })),
    hasMore: rows.length > CAPTURE_PAGE_SIZE,
    page: query.page,
  };
}
