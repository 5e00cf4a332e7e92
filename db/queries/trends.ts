import { and, asc, desc, eq, gte, isNull, lt, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  analyses, analysisFigures, captureInstruments, captures, instruments, organisations, planSteps, ratings, stations, stepRecords, testKind, units,
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
 */
export async function listFigureOfRecord(labId: string, key: TrendSeriesKey, filters: TrendFilters, limit = 5000) {
  const f = analysisFigures;
  const chosen = sql`(${stepRecords.captureId} = ${f.captureId}) is true`;
  const inStep = sql`(${planSteps.checks} @> ${JSON.stringify([key.check])}::jsonb) is true`;
  const valid = sql`(${f.value} is not null and not ${f.flagged})`;
  return getDb()
    .selectDistinctOn([f.unitId], {
      unitId: f.unitId, serial: units.serial, captureId: f.captureId, measuredAt: f.measuredAt, value: f.value, status: f.status, flagged: f.flagged,
      expandedUncertainty: f.expandedUncertainty, testKind: captures.testKind, stationName: stations.name, clientName: organisations.name,
      fromStep: inStep.mapWith(Boolean),
    })
    .from(f)
    .innerJoin(units, eq(units.id, f.unitId))
    .innerJoin(captures, eq(captures.id, f.captureId))
    .innerJoin(analyses, eq(analyses.id, f.analysisId))
    .innerJoin(organisations, eq(organisations.id, units.organisationId))
    .leftJoin(stations, eq(stations.id, captures.stationId))
    .leftJoin(stepRecords, and(eq(stepRecords.unitId, f.unitId), eq(stepRecords.planStepId, analyses.planStepId)))
    .leftJoin(planSteps, and(eq(planSteps.id, analyses.planStepId), isNull(planSteps.retiredAt)))
    .where(and(
      eq(f.labId, labId), eq(units.labId, labId), eq(f.ratingId, key.ratingId), eq(f.figure, key.figure), eq(f.harmonicOrder, key.harmonicOrder), eq(f.current, true),
      filters.from ? gte(f.measuredAt, filters.from) : undefined,
      filters.to ? lt(f.measuredAt, filters.to) : undefined,
      filters.clientId ? eq(units.organisationId, filters.clientId) : undefined,
      filters.testKind ? eq(captures.testKind, filters.testKind) : undefined,
      filters.stationId ? eq(captures.stationId, filters.stationId) : undefined,
      filters.instrumentId
        ? sql`exists (select 1 from ${captureInstruments} ci where ci.capture_id = ${f.captureId} and ci.instrument_id = ${filters.instrumentId})`
        : undefined,
    ))
    .orderBy(f.unitId, desc(chosen), desc(inStep), desc(valid), desc(f.measuredAt))
    .limit(limit);
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
