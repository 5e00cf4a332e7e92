"use client";

import { useEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";

type Point = { v: number; serial: string };

/** One metric across serials over time: each capture a point, with the running mean of the last ten. */
export function TrendChart({ label, unit, series }: { label: string; unit: string; series: Point[] }) {
  const host = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = host.current;
    if (!el) return;
    // Sequence of captures (oldest first) on x; the legend names the serial under the cursor.
    const xs = series.map((_, i) => i + 1);
    const serialAt = (i: number | null) => (i === null ? "—" : series[Math.round(i) - 1]?.serial ?? "—");
    const yFmt = (v: number) => String(Number(v.toPrecision(6)));
    const ys = series.map((p) => p.v);
    const mean = ys.map((_, i) => {
      const window = ys.slice(Math.max(0, i - 9), i + 1);
      return window.reduce((a, b) => a + b, 0) / window.length;
    });
    const plot = new uPlot(
      {
        width: el.clientWidth || 600,
        height: 220,
        scales: { x: { time: false } },
        axes: [
          { label: "capture, oldest → newest", values: (_u, ticks) => ticks.map((t) => (Number.isInteger(t) ? String(t) : "")) },
          { label: unit, size: 70, values: (_u, ticks) => ticks.map(yFmt) },
        ],
        series: [
          { label: "serial", value: (_u, v) => serialAt(v) },
          { label, stroke: "#a85c26", width: 0, points: { show: true, size: 6, fill: "#d08a52" } },
          { label: "mean of last 10", stroke: "#243139", width: 1.5, points: { show: false } },
        ],
      },
      [xs, ys, mean],
      el,
    );
    const resize = () => plot.setSize({ width: el.clientWidth || 600, height: 220 });
    window.addEventListener("resize", resize);
    return () => {
      window.removeEventListener("resize", resize);
      plot.destroy();
    };
  }, [label, unit, series]);
  return <div ref={host} role="img" aria-label={`${label} over time, ${series.length} captures`} />;
}
