import "server-only";
import { z } from "zod";
import { CAPTURE_SORTS, listCapturePage } from "@/db/queries/capture-list";
import { captureState } from "@/db/schema";
import { TEST_KINDS } from "@/lib/captures/input-schemas";
import type { Actor } from "./actor";

const blank = (v: unknown) => (Array.isArray(v) ? v[0] : v === "" ? undefined : v);
const optional = <T extends z.ZodType>(schema: T) => z.preprocess(blank, schema.optional());

/** The captures list's query string (page and GET /api/captures alike). */
export const captureListQuerySchema = z.object({
  q: optional(z.string().trim().max(64)),
  state: optional(z.enum(captureState.enumValues)),
  overall: optional(z.enum(["pass", "marginal", "fail", "not-applicable", "unjudged"])),
  kind: optional(z.enum(TEST_KINDS)),
  sort: z.preprocess(blank, z.enum(CAPTURE_SORTS).default("captured")),
  dir: z.preprocess(blank, z.enum(["asc", "desc"]).default("desc")),
  page: z.preprocess(blank, z.coerce.number().int().min(1).max(10_000).default(1)),
});

export type CaptureListQuery = z.infer<typeof captureListQuerySchema>;
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
