"use client";

import { useEffect, useRef } from "react";
import uPlot from "uplot";

/**
 * Mounts a uPlot chart in the returned ref's element, sized to its width, and rebuilds it when
 * `build` changes. uPlot draws on a canvas, so the chart exists only in the browser.
 */
export function useUplot(build: (width: number) => { options: uPlot.Options; data: uPlot.AlignedData } | null, height: number) {
  const ref = useRef<HTMLDivElement>(null);
  const chart = useRef<uPlot | null>(null);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const spec = build(el.clientWidth || 800);
    if (!spec) return;
    const plot = new uPlot({ ...spec.options, width: el.clientWidth || 800, height }, spec.data, el);
    chart.current = plot;
    const observer = new ResizeObserver(() => plot.setSize({ width: el.clientWidth || 800, height }));
    observer.observe(el);
    return () => {
      observer.disconnect();
      plot.destroy();
      chart.current = null;
    };
  }, [build, height]);
  return { ref, chart };
}

export const CHANNEL_COLOURS = ["#a85c26", "#17695a", "#3b5bdb", "#8a5a00", "#a3242a", "#4a5a63", "#7b3fa0", "#0b7285"];
