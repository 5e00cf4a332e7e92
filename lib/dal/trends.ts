import "server-only";
import { getProfileInForce } from "@/db/queries/judgement";
import { getLabRating, listFigureOfRecord, listLabRatingsWithUnits, listTrendFigures, listTrendFilterOptions, type TrendFilters } from "@/db/queries/trends";
import { summariseSeries, type SpcSummary } from "@/lib/analysis";
import { HttpError, requireApiUser, requireRole } from "@/lib/auth/guards";
import type { SessionUser } from "@/lib/auth/options";
import { renderTrendCsv } from "@/lib/trends/csv";
import { trendBand, type TrendBand } from "@/lib/trends/band";
import { HARMONIC_FIGURE } from "@/lib/trends/figure-rows";
import { checkOfFigure, TREND_FIGURE_LABELS, type TrendQuery } from "@/lib/trends/query";
import type { TrendPoint } from "@/lib/trends/types";
import { scopeFor } from "./scope";

export type { TrendPoint };

export type TrendView = {
  ratings: { id: string; modelCode: string; title: string; unitCount: number }[];
  rating: { id: string; modelCode: string; title: string } | null;
  figures: { figure: string; harmonicOrder: number }[];
  label: string;
  band: TrendBand | null;
  /** Points with a value, in x order: those in the statistics and those flagged. */
  points: TrendPoint[];
  /** Units whose record has no value at all (nothing to draw). */
  missing: { serial: string; captureId: string }[];
  summary: SpcSummary | null;
  options: Awaited<ReturnType<typeof listTrendFilterOptions>>;
};

const serialOrder = new Intl.Collator("en", { numeric: true });

function filtersOf(q: TrendQuery): TrendFilters {
  const next = (d: string) => new Date(Date.parse(`${d}T00:00:00Z`) + 86_400_000);
  return {
    from: q.from ? new Date(`${q.from}T00:00:00Z`) : undefined, to: q.to ? next(q.to) : undefined,
    clientId: q.client, testKind: q.kind, stationId: q.bench, instrumentId: q.instrument,
  };
}

/**
 * A rating's trend for one figure: each unit's figure of record against serial or date, the band of
 * the profile in force, and I-MR statistics over the points that are not flagged. Lab managers and
 * quality engineers of the rating's lab; another lab's rating answers 404 like a missing one.
 */
export async function getTrendView(q: TrendQuery): Promise<TrendView> {
  return loadTrendView(await requireRole("qa", "admin"), q);
}

/** The CSV export's door: the same view, with the API's 401/403 instead of the page's redirects. */
export async function getTrendCsv(q: TrendQuery): Promise<{ fileName: string; body: string }> {
  const view = await loadTrendView(await requireApiUser("qa", "admin"), q);
  const stem = `${view.rating?.modelCode ?? "trend"}-${q.figure === HARMONIC_FIGURE ? `h${q.order}` : q.figure}`.replace(/[^\w.-]/g, "_");
  return { fileName: `emfolio-trend-${stem}.csv`, body: renderTrendCsv(view) };
}

async function loadTrendView(user: SessionUser, q: TrendQuery): Promise<TrendView> {
  const scope = scopeFor(user);
  if (scope.kind !== "lab") throw new HttpError(403, "Trends are for lab staff");
  const ratingList = await listLabRatingsWithUnits(scope.labId);
  const ratingId = q.rating ?? ratingList[0]?.id;
  const empty = { figures: [], band: null, points: [], missing: [], summary: null, options: { clients: [], benches: [], instruments: [] } };
  if (!ratingId) return { ratings: ratingList, rating: null, label: TREND_FIGURE_LABELS[q.figure], ...empty };
  const rating = await getLabRating(scope.labId, ratingId);
  if (!rating) throw new HttpError(404, "No such model");
  const order = q.figure === HARMONIC_FIGURE ? q.order : 0;
  const [profile, figures, rows, options] = await Promise.all([
    getProfileInForce(rating.id),
    listTrendFigures(scope.labId, rating.id),
    listFigureOfRecord(scope.labId, { ratingId: rating.id, figure: q.figure, harmonicOrder: order, check: checkOfFigure(q.figure) }, filtersOf(q)),
    listTrendFilterOptions(scope.labId, rating.id),
  ]);
  const band = trendBand(rating.nameplate, profile?.profile, q.figure);
  const sorted = [...rows].sort((a, b) => (q.x === "date" ? a.measuredAt.getTime() - b.measuredAt.getTime() : serialOrder.compare(a.serial, b.serial)));
  const drawn = sorted.filter((r) => r.value !== null);
  const counted = drawn.filter((r) => !r.flagged);
  const summary = summariseSeries(counted.map((r) => r.value as number), band ?? { lower: null, upper: null });
  const rulesOf = new Map(counted.map((r, i) => [r.unitId, summary?.rules[i] ?? []]));
  const points = drawn.map((r): TrendPoint => ({
    unitId: r.unitId, serial: r.serial, captureId: r.captureId, measuredAt: r.measuredAt.toISOString(), value: r.value as number, status: r.status, flagged: r.flagged,
    testKind: r.testKind, bench: r.stationName, rules: r.flagged ? [] : rulesOf.get(r.unitId) ?? [], expandedUncertainty: r.expandedUncertainty,
  }));
  const label = q.figure === HARMONIC_FIGURE ? `Harmonic order ${q.order}` : TREND_FIGURE_LABELS[q.figure];
  return {
    ratings: ratingList, rating: { id: rating.id, modelCode: rating.modelCode, title: rating.title }, figures, label, band, points,
    missing: sorted.filter((r) => r.value === null).map((r) => ({ serial: r.serial, captureId: r.captureId })), summary, options,
  };
}
