import "server-only";
import { listCapturePage } from "@/db/queries/capture-list";
import { captureListQuerySchema, type CaptureListQuery } from "@/lib/captures/list-query";
import type { Actor } from "./actor";
import { parseInput } from "./request";

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

/** The JSON answer of GET /api/captures and GET /api/v1/captures: the query string parsed (400 naming a bad one), one page. */
export async function captureListResponse(actor: Actor, request: Request): Promise<Response> {
  const query = parseInput(captureListQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  const view = await getCaptureListView(actor, query);
  return Response.json({ captures: view.rows, page: view.page, hasMore: view.hasMore }, { headers: { "Cache-Control": "no-store" } });
}
