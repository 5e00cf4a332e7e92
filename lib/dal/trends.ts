import "server-only";
import { z } from "zod";
import { listRatingsInScope, listTrendPoints } from "@/db/queries/trends";
import { requireRole } from "@/lib/auth/guards";
import { scopeFor } from "./scope";

export const TREND_METRICS = [
  { key: "worstThdPercent", label: "Worst-channel THD", unit: "%" },
  { key: "vufPercent", label: "Voltage unbalance (VUF)", unit: "%" },
  { key: "frequencyHz", label: "Frequency", unit: "Hz" },
  { key: "keLineRmsPerKrpm", label: "Ke (line, rms)", unit: "V/krpm" },
] as const;

export type TrendMetric = (typeof TREND_METRICS)[number]["key"];

function summarise(values: number[]) {
  if (values.length === 0) return null;
  const mean = values.reduce((a, b) => a + b, 0) / values.length;
  const sd = values.length > 1 ? Math.sqrt(values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1)) : 0;
  return { n: values.length, mean, sd, min: Math.min(...values), max: Math.max(...values) };
}

export async function getTrendsView(ratingIdRaw: string | undefined) {
  const user = await requireRole("qa", "admin");
  const scope = scopeFor(user);
  const ratingList = await listRatingsInScope(scope);
  const ratingId = z.uuid().safeParse(ratingIdRaw).success ? ratingIdRaw : ratingList[0]?.id;
  const rating = ratingList.find((r) => r.id === ratingId);
  if (!rating) return { ratings: ratingList.map(({ nameplate: _n, ...r }) => r), rating: null, points: [], metrics: [] };
  const points = await listTrendPoints(scope, rating.id);
  // Ke is a permanent-magnet figure: shown for models whose nameplate states one.
  const hasKe = typeof rating.nameplate === "object" && rating.nameplate !== null && "keLineRmsPerKrpm" in rating.nameplate;
  const metrics = TREND_METRICS.filter((m) => m.key !== "keLineRmsPerKrpm" || hasKe).map((m) => {
    const series = points.flatMap((p) => (p[m.key] === null ? [] : [{ v: p[m.key] as number, serial: p.serial }]));
    return { ...m, series, summary: summarise(series.map((s) => s.v)) };
  }).filter((m) => m.series.length > 0);
  return { ratings: ratingList.map(({ nameplate: _n, ...r }) => r), rating, points, metrics };
}
