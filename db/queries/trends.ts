import { and, asc, eq, sql, type SQL } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  analysisFigures, captureInstruments, captures, instruments, organisations, planSteps, ratings, stations, stepRecords, testKind, units,
  type AnalysisFigure, type Capture,
} from "@/db/schema";
import { unitScopeWhere } from "./scope";

// Trends read analysis_figures (one row per judged figure of an analysis), never the stored reports:
// the figure of record per unit is picked in SQL over the (rating, figure, order, measured_at) index.

export type TrendFilters = {
  from?: Date;
  /** Exclusive. */
  to?: Date;
  clientId?: string;
  testKind?: (typeof testKind.enumValues)[number];
  stationId?: string;
  instrumentId?: string;
};

export type TrendSeriesKey = { ratingId: string; figure: string; harmonicOrder: number; /** The plan check whose steps hold the record. */ check: string };

/** Ratings of the lab that have units, with how many. */
export async function listLabRatingsWithUnits(labId: string) {
  return getDb()
    .select({ id: ratings.id, modelCode: ratings.modelCode, title: ratings.title, unitCount: sql<number>`count(*)`.mapWith(Number) })
    .from(ratings)
    .innerJoin(units, eq(units.ratingId, ratings.id))
    .where(and(eq(ratings.labId, labId), unitScopeWhere({ kind: "lab", labId })))
    .groupBy(ratings.id)
    .orderBy(asc(ratings.modelCode));
}

/** One rating of the lab (another lab's, or none, is undefined: the caller answers 404). */
export async function getLabRating(labId: string, ratingId: string) {
  const [row] = await getDb().select().from(ratings).where(and(eq(ratings.id, ratingId), eq(ratings.labId, labId))).limit(1);
  return row;
}

/**
 * The figures (and harmonic orders) the rating's current analyses carry. A skip scan over the trend
 * index, one probe per distinct pair: a rating can have hundreds of thousands of figure rows.
 */
export async function listTrendFigures(labId: string, ratingId: string): Promise<{ figure: string; harmonicOrder: number }[]> {
  const f = analysisFigures;
  const result = await getDb().execute<{ figure: string; harmonic_order: number }>(sql`
    with recursive pairs as (
      (select ${f.figure} as figure, ${f.harmonicOrder} as harmonic_order from ${f}
        where ${f.ratingId} = ${ratingId} and ${f.current} and ${f.labId} = ${labId} order by ${f.figure}, ${f.harmonicOrder} limit 1)
      union all
      select n.figure, n.harmonic_order from pairs p cross join lateral (
        select ${f.figure} as figure, ${f.harmonicOrder} as harmonic_order from ${f}
        where ${f.ratingId} = ${ratingId} and ${f.current} and ${f.labId} = ${labId} and (${f.figure}, ${f.harmonicOrder}) > (p.figure, p.harmonic_order)
        order by ${f.figure}, ${f.harmonicOrder} limit 1) n
    )
    select figure, harmonic_order from pairs`);
  return result.rows.map((r) => ({ figure: r.figure, harmonicOrder: Number(r.harmonic_order) }));
}

/**
 * The figure of record of each unit: the capture a quality engineer chose for a plan step that
 * judges the check, else the latest capture judged for such a step, else the latest valid capture
 * (a value, not flagged), else the latest one. Filters narrow the captures before the pick.
 *
 * Per unit, the tiers are tried in that order, each a backward scan of the unit's short range of
 * analysis_figures_record_idx that stops at its first row (every column the pick needs is in the
 * index, and the step a row was judged for is on the row); `limit 1` over the `union all` stops at
 * the first tier that has one, so a typical unit costs one or two index probes, not a sort of all
 * its captures.
 */
export async function listFigureOfRecord(labId: string, key: TrendSeriesKey, filters: TrendFilters, limit = 5000) {
  const f = analysisFigures;
  const needsCapture = Boolean(filters.testKind || filters.stationId);
  const range = sql`${f.ratingId} = ${key.ratingId} and ${f.figure} = ${key.figure} and ${f.harmonicOrder} = ${key.harmonicOrder} and ${f.unitId} = u.id
    and ${f.current} and ${f.labId} = ${labId}${sql.join([
      filters.from ? sql` and ${f.measuredAt} >= ${filters.from.toISOString()}` : sql``,
      filters.to ? sql` and ${f.measuredAt} < ${filters.to.toISOString()}` : sql``,
      filters.testKind ? sql` and fc.test_kind = ${filters.testKind}` : sql``,
      filters.stationId ? sql` and fc.station_id = ${filters.stationId}` : sql``,
      filters.instrumentId
        ? sql` and exists (select 1 from ${captureInstruments} ci where ci.capture_id = ${f.captureId} and ci.instrument_id = ${filters.instrumentId})`
        : sql``,
    ])}`;
  const valid = sql`${f.value} is not null and not ${f.flagged}`;
  // `= any(array(...))`, not `in (select ...)`: the planner turned the `in` into a join that lost the
  // index order, so each unit read all ~100 of its entries and sorted them (90 ms for 500 units, 21 ms so).
  const fromStep = sql`${f.planStepId} = any(array(select id from steps))`;
  const tier = (fromStepValue: boolean, where: SQL, order: SQL) => sql`(select ${f.captureId} as capture_id, ${f.measuredAt} as measured_at,
      ${f.value} as value, ${f.status} as status, ${f.flagged} as flagged, ${f.expandedUncertainty} as expanded_uncertainty, ${sql.raw(String(fromStepValue))} as from_step
    from ${f}${needsCapture ? sql` join ${captures} fc on fc.id = ${f.captureId}` : sql``}
    where ${range} and ${where} order by ${order} limit 1)`;
  const latest = sql`${f.measuredAt} desc`;
  const chosen = sql`exists (select 1 from ${stepRecords} sr where sr.unit_id = u.id and sr.plan_step_id in (select id from steps))
    and (${f.planStepId}, ${f.captureId}) in (select sr.plan_step_id, sr.capture_id from ${stepRecords} sr where sr.unit_id = u.id) and ${fromStep}`;
  const result = await getDb().execute<{
    unit_id: string; serial: string; capture_id: string; measured_at: string | Date; value: number | null; status: AnalysisFigure["status"]; flagged: boolean;
    expanded_uncertainty: number | null; test_kind: Capture["testKind"]; station_name: string | null; client_name: string; from_step: boolean;
  }>(sql`
    with steps as (
      select ${planSteps.id} as id from ${planSteps}
      where ${planSteps.ratingId} = ${key.ratingId} and ${planSteps.retiredAt} is null and ${planSteps.checks} @> ${JSON.stringify([key.check])}::jsonb
    )
    select u.id as unit_id, u.serial, p.capture_id, p.measured_at, p.value, p.status, p.flagged, p.expanded_uncertainty, p.from_step,
      c.test_kind, st.name as station_name, o.name as client_name
    from ${units} u
    cross join lateral (
      select * from (
        ${tier(true, chosen, sql`(${valid}) desc, ${latest}`)}
        union all ${tier(true, sql`${fromStep} and ${valid}`, latest)}
        union all ${tier(true, fromStep, latest)}
        union all ${tier(false, valid, latest)}
        union all ${tier(false, sql`true`, latest)}
      ) tiers limit 1
    ) p
    join ${captures} c on c.id = p.capture_id
    join ${organisations} o on o.id = u.organisation_id
    left join ${stations} st on st.id = c.station_id
    where u.rating_id = ${key.ratingId} and u.lab_id = ${labId}${filters.clientId ? sql` and u.organisation_id = ${filters.clientId}` : sql``}
    order by u.id
    limit ${limit}`);
  return result.rows.map((r) => ({
    unitId: r.unit_id, serial: r.serial, captureId: r.capture_id, measuredAt: new Date(r.measured_at), value: r.value === null ? null : Number(r.value),
    status: r.status, flagged: r.flagged, expandedUncertainty: r.expanded_uncertainty === null ? null : Number(r.expanded_uncertainty),
    testKind: r.test_kind, stationName: r.station_name, clientName: r.client_name, fromStep: r.from_step,
  }));
}

/** What the filters offer: the rating's clients, the lab's benches and instruments. */
export async function listTrendFilterOptions(labId: string, ratingId: string) {
  const db = getDb();
  const [clients, benches, kit] = await Promise.all([
    db.selectDistinct({ id: organisations.id, name: organisations.name }).from(units).innerJoin(organisations, eq(organisations.id, units.organisationId))
      .where(and(eq(units.ratingId, ratingId), eq(units.labId, labId))).orderBy(asc(organisations.name)),
    db.select({ id: stations.id, name: stations.name }).from(stations).where(eq(stations.labId, labId)).orderBy(asc(stations.name)),
    db.select({ id: instruments.id, label: sql<string>`${instruments.assetTag} || ' · ' || ${instruments.make} || ' ' || ${instruments.model}` })
      .from(instruments).where(eq(instruments.labId, labId)).orderBy(asc(instruments.assetTag)),
  ]);
  return { clients, benches, instruments: kit };
}
