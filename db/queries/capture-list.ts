import { and, asc, desc, eq, ilike, inArray, isNull, sql, type SQL } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, units, type CaptureState } from "@/db/schema";
import type { CaptureSort, ListPlace } from "@/lib/captures/list-query";
import { unitScopeWhere, type Scope } from "./scope";

export type CaptureListFilter = {
  search?: string;
  state?: CaptureState;
  /** A verdict of the current analysis, or "unjudged" for captures without one. */
  overall?: "pass" | "marginal" | "inconclusive" | "fail" | "not-applicable" | "unjudged";
  testKind?: "no-load" | "load" | "back-emf" | "other";
  sort: CaptureSort;
  dir: "asc" | "desc";
  limit: number;
  offset: number;
  /** Sorted on capture time: the rows after this place (the next page), instead of the offset. */
  after?: ListPlace;
  /** Sorted on capture time: the rows just before this place (the previous page). */
  before?: ListPlace;
};

const SORT_COLUMNS = {
  captured: captures.createdAt,
  frequency: analyses.frequencyHz,
  thd: analyses.worstThdPercent,
  vuf: analyses.vufPercent,
  ke: analyses.keLineRmsPerKrpm,
} as const;

const columns = {
  id: captures.id, serial: units.serial, unitId: units.id, testKind: captures.testKind, state: captures.state,
  stateMessage: captures.stateMessage, progress: captures.progress, originalName: captures.originalName,
  speedRpm: captures.speedRpm, createdAt: captures.createdAt, overall: analyses.overall,
  frequencyHz: analyses.frequencyHz, worstThdPercent: analyses.worstThdPercent, vufPercent: analyses.vufPercent,
  keLineRmsPerKrpm: analyses.keLineRmsPerKrpm,
  /** The row's place for the next page's cursor: the capture time to the microsecond (a Date keeps milliseconds). */
  place: sql<string>`to_char(${captures.createdAt} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"') || '~' || ${captures.id}`,
};
const currentAnalysis = and(eq(analyses.captureId, captures.id), eq(analyses.current, true));

/**
 * One page of the captures the scope may see, with the headline numbers of each current analysis.
 * Sorted on a figure, the judged captures come first through an inner join (so the figure's index gives
 * the order; a left join made PostgreSQL sort every capture of the lab), then those without a current
 * analysis, newest first.
 */
export async function listCapturePage(scope: Scope, filter: CaptureListFilter) {
  const where: SQL[] = [unitScopeWhere(scope)];
  // A lab's captures carry its id too: filtering on it lets the (lab_id, created_at) index give the order.
  if (scope.kind === "lab") where.push(eq(captures.labId, scope.labId));
  if (filter.search) where.push(ilike(units.serial, `%${filter.search.replace(/[%_\\]/g, "\\$&")}%`));
  if (filter.state) where.push(eq(captures.state, filter.state));
  if (filter.testKind) where.push(eq(captures.testKind, filter.testKind));
  if (filter.overall === "unjudged") where.push(sql`${analyses.overall} is null`);
  else if (filter.overall) where.push(eq(analyses.overall, filter.overall));
  const newest = [desc(captures.createdAt), asc(captures.id)];
  const db = getDb();
  const column = SORT_COLUMNS[filter.sort];
  // Captures without the figure go last either way.
  const order = filter.sort === "captured" ? (filter.dir === "asc" ? asc(captures.createdAt) : desc(captures.createdAt))
    : filter.dir === "asc" ? sql`${column} asc nulls last` : sql`${column} desc nulls last`;
  if (filter.sort === "captured" && (filter.after || filter.before)) return placePage(where, filter);
  if (filter.sort === "captured" && !filter.overall) {
    // The page's ids first, without the analyses join, then the page itself: a deep page (an offset of
    // thousands) then skips index entries instead of joining every skipped capture to its analysis.
    const page = db.select({ id: captures.id }).from(captures).innerJoin(units, eq(units.id, captures.unitId))
      .where(and(...where)).orderBy(order, ...newest).limit(filter.limit).offset(filter.offset);
    return db.select(columns).from(captures).innerJoin(units, eq(units.id, captures.unitId)).leftJoin(analyses, currentAnalysis)
      .where(inArray(captures.id, page)).orderBy(order, ...newest);
  }
  if (filter.sort === "captured" || filter.overall === "unjudged") {
    return db.select(columns).from(captures).innerJoin(units, eq(units.id, captures.unitId)).leftJoin(analyses, currentAnalysis)
      .where(and(...where)).orderBy(order, ...newest).limit(filter.limit).offset(filter.offset);
  }
  const judged = await db.select(columns).from(captures).innerJoin(units, eq(units.id, captures.unitId))
    .innerJoin(analyses, currentAnalysis).where(and(...where)).orderBy(order, ...newest).limit(filter.limit).offset(filter.offset);
  // A verdict filter has only judged captures; otherwise the unjudged follow, where the judged end.
  if (judged.length === filter.limit || filter.overall) return judged;
  const judgedTotal = judged.length > 0 || filter.offset === 0 ? filter.offset + judged.length
    : Number((await db.select({ n: sql<number>`count(*)` }).from(captures).innerJoin(units, eq(units.id, captures.unitId))
      .innerJoin(analyses, currentAnalysis).where(and(...where)))[0]?.n ?? 0);
  const rest = await db.select(columns).from(captures).innerJoin(units, eq(units.id, captures.unitId)).leftJoin(analyses, currentAnalysis)
    .where(and(...where, isNull(analyses.id))).orderBy(...newest)
    .limit(filter.limit - judged.length).offset(Math.max(0, filter.offset - judgedTotal));
  return [...judged, ...rest];
}

/**
 * A page by capture time from a place (keyset paging): the index on capture time starts at the place,
 * so page 2 000 costs what page 1 does. The order is capture time (either way) then id ascending; the
 * rows before a place are read in the reverse order and turned round.
 */
async function placePage(where: SQL[], filter: CaptureListFilter) {
  const place = (filter.after ?? filter.before)!;
  const at = sql`${place.at}::timestamptz`;
  const forward = filter.after !== undefined;
  // Newest first, "after" is older: earlier time, or the same time and a greater id.
  const later = (filter.dir === "desc") !== forward;
  const beyond = later
    ? sql`${captures.createdAt} >= ${at} and (${captures.createdAt} > ${at} or ${captures.id} ${forward ? sql`>` : sql`<`} ${place.id})`
    : sql`${captures.createdAt} <= ${at} and (${captures.createdAt} < ${at} or ${captures.id} ${forward ? sql`>` : sql`<`} ${place.id})`;
  const rows = await getDb().select(columns).from(captures).innerJoin(units, eq(units.id, captures.unitId)).leftJoin(analyses, currentAnalysis)
    .where(and(...where, beyond))
    .orderBy(later ? asc(captures.createdAt) : desc(captures.createdAt), forward ? asc(captures.id) : desc(captures.id))
    .limit(filter.limit);
  return forward ? rows : rows.reverse();
}
