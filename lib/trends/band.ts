import { ratingSchema, toleranceProfileSchema } from "@/lib/analysis";
import { figures } from "@/lib/analysis/figures";
import { checkOfFigure, type TrendFigure } from "./query";

export type TrendBand = {
  lower: number | null;
  upper: number | null;
  nominal: number | null;
  unit: string;
  /** The marginal zones inside the band: [from, to] in the figure's unit (judge() in lib/analysis/verdicts.ts). */
  marginal: [number, number][];
};

/**
 * The band of the profile in force at the nameplate's rated speed (captures at other speeds are judged
 * against a band scaled to their speed; the trend draws the rated one). Null when the rating or profile
 * does not parse or the check is not required.
 */
export function trendBand(nameplate: unknown, profile: unknown, figure: TrendFigure): TrendBand | null {
  const rating = ratingSchema.safeParse(nameplate);
  const tolerance = toleranceProfileSchema.safeParse(profile);
  if (!rating.success || !tolerance.success) return null;
  // No measurement: every figure is null, the bands are those of the nameplate at rated speed.
  const all = figures({ channels: [], frequencyHz: rating.data.frequencyHz, threePhase: null, backEmf: null, warnings: [] }, rating.data, tolerance.data);
  const fig = all[checkOfFigure(figure)];
  const band = fig.band;
  if (!band) return null;
  const zone = band.marginalZonePercent / 100;
  const marginal: [number, number][] = [];
  if (band.upper !== null) marginal.push([band.upper - zone * Math.abs(band.upper - band.nominal), band.upper]);
  if (band.lower !== null) marginal.push([band.lower, band.lower + zone * Math.abs(band.nominal - band.lower)]);
  return { lower: band.lower, upper: band.upper, nominal: band.lower !== null ? band.nominal : null, unit: fig.unit, marginal };
}
