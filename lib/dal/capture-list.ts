import "server-only";
import { listCapturePage } from "@/db/queries/capture-list";
import { captureListQuerySchema, placeOf, type CaptureListQuery } from "@/lib/captures/list-query";
import type { Actor } from "./actor";
import { parseInput } from "./request";

export const CAPTURE_PAGE_SIZE = 50;

/**
 * One page of captures for the actor's scope, newest first unless sorted on a figure. Sorted on capture
 * time, the page's `after` and `before` are the places of its last and first rows: the next and previous
 * pages read from there (keyset paging), where a page number alone would skip every earlier row.
 */
export async function getCaptureListView(actor: Actor, query: CaptureListQuery) {
  const byTime = query.sort === "captured";
  const after = byTime ? placeOf(query.after) : undefined;
  const before = byTime && !after ? placeOf(query.before) : undefined;
  const read = (from: { after?: typeof after; before?: typeof before; page: number }) => listCapturePage(actor.scope, {
    search: query.q || undefined, state: query.state, overall: query.overall, testKind: query.kind,
    sort: query.sort, dir: query.dir, limit: CAPTURE_PAGE_SIZE + 1, offset: (from.page - 1) * CAPTURE_PAGE_SIZE, after: from.after, before: from.before,
  });
  const fetched = await read({ after, before, page: query.page });
  const extra = fetched.length > CAPTURE_PAGE_SIZE;
  // Fewer than a page before the place: that is the start of the list, so show the first page whole.
  if (before && !extra) return getCaptureListView(actor, { ...query, before: undefined, page: 1 });
  // Read backwards from `before`, the extra row is the far end, at the top.
  const page = before ? fetched.slice(extra ? 1 : 0) : fetched.slice(0, CAPTURE_PAGE_SIZE);
  const rows = page.map(({ place: _place, ...r }) => ({ ...r, createdAt: r.createdAt.toISOString() }));
  return {
    rows,
    hasMore: before ? true : extra,
    hasPrevious: before ? extra : after ? true : query.page > 1,
    page: query.page,
    after: byTime && page.length > 0 ? page[page.length - 1]!.place : undefined,
    before: byTime && page.length > 0 ? page[0]!.place : undefined,
  };
}

/** The JSON answer of GET /api/captures and GET /api/v1/captures: the query string parsed (400 naming a bad one), one page. */
export async function captureListResponse(actor: Actor, request: Request): Promise<Response> {
  const query = parseInput(captureListQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  const view = await getCaptureListView(actor, query);
  const next = view.hasMore ? view.after : undefined;
  return Response.json({ captures: view.rows, page: view.page, hasMore: view.hasMore, next }, { headers: { "Cache-Control": "no-store" } });
}
