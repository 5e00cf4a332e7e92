"use client";

import { useEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";

type Point = { t: number; v: number; serial: string };

/** One metric across serials over time: each capture a point, with the running mean of the last ten. */
export function TrendChart({ label, unit, series }: { label: string; unit: string; series: Point[] }) {
  const host = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = host.current;
    if (!el) return;
    const xs = series.map((p) => p.t);
    const ys = series.map((p) => p.v);
    const mean = ys.map((_, i) => {
      const window = ys.slice(Math.max(0, i - 9), i + 1);
      return window.reduce((a, b) => a + b, 0) / window.length;
    });
    const plot = new uPlot(
      {
        width: el.clientWidth || 600,
        height: 220,
        scales: { x: { time: true } },
        axes: [{}, { label: unit, size: 60 }],
        series: [
          {},
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
