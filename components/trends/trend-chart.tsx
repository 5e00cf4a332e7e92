"use client";

import { useCallback } from "react";
import type uPlot from "uplot";
import "uplot/dist/uPlot.min.css";
import { useUplot } from "@/components/plots/use-uplot";
import { axisRange, formatTick } from "@/lib/trends/axis";

export type ChartPoint = { serial: string; t: number; value: number; flagged: boolean; ruled: boolean };
export type ChartLimits = { centre: number | null; ucl: number | null; lcl: number | null };
export type ChartBand = { lower: number | null; upper: number | null; marginal: [number, number][] } | null;

const BAND_FILL = "rgba(23, 105, 90, 0.08)";
const MARGINAL_FILL = "rgba(196, 140, 20, 0.22)";

/**
 * One figure across units: the tolerance band shaded with its marginal zones, each unit's figure of
 * record (flagged ones hollow and grey, points breaking a run rule ringed), the centre line and the
 * I-MR control limits. The band (or a minimum span) sets the y scale, so noise is not magnified.
 */
export function TrendChart({ label, unit, points, band, limits, byDate }: { label: string; unit: string; points: ChartPoint[]; band: ChartBand; limits: ChartLimits; byDate: boolean }) {
  const build = useCallback((width: number) => {
    if (points.length === 0) return null;
    const xs = points.map((p, i) => (byDate ? p.t / 1000 : i + 1));
    const counted = points.map((p) => (p.flagged ? null : p.value));
    const flagged = points.map((p) => (p.flagged ? p.value : null));
    const ruled = points.map((p) => (p.ruled ? p.value : null));
    const flat = (v: number | null) => xs.map(() => v);
    const range = axisRange(points.map((p) => p.value), band, [limits.ucl, limits.lcl]);
    const shade: uPlot.Plugin = {
      hooks: {
        drawClear: (u) => {
          const { ctx, bbox } = u;
          const y = (v: number) => u.valToPos(v, "y", true);
          const fill = (from: number, to: number, colour: string) => {
            const top = y(Math.min(Math.max(to, range.min), range.max));
            const bottom = y(Math.max(Math.min(from, range.max), range.min));
            ctx.fillStyle = colour;
            ctx.fillRect(bbox.left, top, bbox.width, bottom - top);
          };
          if (!band || (band.lower === null && band.upper === null)) return;
          ctx.save();
          fill(band.lower ?? range.min, band.upper ?? range.max, BAND_FILL);
          for (const [from, to] of band.marginal) fill(from, to, MARGINAL_FILL);
          ctx.restore();
        },
      },
    };
    const line = (name: string, stroke: string, dash?: number[]): uPlot.Series => ({ label: name, stroke, width: 1.25, dash, points: { show: false } });
    // Points only: no line between units and no area under them (a series fill would shade to the axis).
    const dots = (name: string, stroke: string, fill: string, size: number): uPlot.Series => ({ label: name, stroke, width: 0, points: { show: true, size, stroke, fill, width: 1.5 } });
    const options: uPlot.Options = {
      width,
      height: 320,
      plugins: [shade],
      scales: { x: { time: byDate }, y: { range: () => [range.min, range.max] } },
      axes: [
        byDate ? { label: "date measured", space: 90 } : { label: "unit, by serial", space: 110, values: (_u, ticks) => ticks.map((t) => (Number.isInteger(t) ? points[t - 1]?.serial ?? "" : "")) },
        { label: unit ? `${label} (${unit})` : label, size: 80, values: (_u, ticks, _a, _s, step) => ticks.map((t) => formatTick(t, step)) },
      ],
      series: [
        { label: byDate ? "date" : "serial", value: (_u, v) => (v === null ? "—" : byDate ? new Date(v * 1000).toISOString().slice(0, 10) : points[Math.round(v) - 1]?.serial ?? "—") },
        dots("in statistics", "#a85c26", "#d08a52", 7),
        dots("flagged, left out", "#8a949a", "rgba(255,255,255,0)", 8),
        dots("breaks a run rule", "#a3242a", "rgba(255,255,255,0)", 13),
        line("centre", "#243139"),
        line("UCL", "#3b5bdb", [6, 4]),
        line("LCL", "#3b5bdb", [6, 4]),
        line("band upper", "#17695a"),
        line("band lower", "#17695a"),
      ],
    };
    const data: uPlot.AlignedData = [xs, counted, flagged, ruled, flat(limits.centre), flat(limits.ucl), flat(limits.lcl), flat(band?.upper ?? null), flat(band?.lower ?? null)];
    return { options, data };
  }, [points, band, limits, byDate, label, unit]);
  const { ref } = useUplot(build, 320);
  return <div ref={ref} role="img" aria-label={`${label}: ${points.length} units${band ? ", with the tolerance band" : ""}`} data-testid="trend-chart" />;
}
