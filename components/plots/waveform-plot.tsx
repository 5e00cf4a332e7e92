"use client";

import "uplot/dist/uPlot.min.css";
import { useCallback } from "react";
import type uPlot from "uplot";
import type { WaveformPreview } from "@/lib/dal/captures";
import { axisLabel, tickLabels, unitsInOrder } from "./axes";
import { ChannelLegend } from "./channel-legend";
import { CHANNEL_COLOURS, useUplot } from "./use-uplot";

const HEIGHT = 320;

/** Wheel zooms the time axis around the cursor (drag selects a span, double-click resets). */
function wheelZoom(): uPlot.Plugin {
  return {
    hooks: {
      ready: (u) => {
        u.over.addEventListener("wheel", (e) => {
          e.preventDefault();
          const { min, max } = u.scales.x ?? {};
          if (min === undefined || max === undefined) return;
          const at = u.posToVal(e.offsetX, "x");
          const factor = e.deltaY < 0 ? 0.8 : 1.25;
          u.setScale("x", { min: at - (at - min) * factor, max: at + (max - at) * factor });
        }, { passive: false });
      },
    },
  };
}

/** A channel's unit from "id=V,id=A"; a channel not named there is a voltage. */
function unitReader(unitsKey: string): (id: string) => "V" | "A" {
  const units = new Map(unitsKey.split(",").map((pair) => pair.split("=") as [string, string]));
  return (id) => (units.get(id) === "A" ? "A" : "V");
}

/**
 * All channels of the min/max envelope: each channel is a band between its bucket minima and
 * maxima, on a voltage axis and (when currents were recorded) a current axis on the right.
 * `unitsKey` is "id=V,id=A" so the chart is rebuilt only when the channels change.
 */
export function WaveformPlot({ preview, unitsKey = "" }: { preview: WaveformPreview; unitsKey?: string }) {
  const unitOf = unitReader(unitsKey);
  const build = useCallback(() => {
    const channelUnit = unitReader(unitsKey);
    const data: (number[])[] = [preview.timeS];
    const series: uPlot.Series[] = [{ label: "Time (s)" }];
    const bands: uPlot.Band[] = [];
    preview.channels.forEach((c, i) => {
      const colour = CHANNEL_COLOURS[i % CHANNEL_COLOURS.length] as string;
      const scale = channelUnit(c.id);
      data.push(c.max, c.min);
      series.push({ label: `${c.id} max`, stroke: colour, width: 1, scale }, { label: `${c.id} min`, stroke: colour, width: 1, scale });
      bands.push({ series: [data.length - 2, data.length - 1], fill: `${colour}40` });
    });
    const values = (_u: uPlot, splits: number[]) => tickLabels(splits);
    const yAxes: uPlot.Axis[] = unitsInOrder(preview.channels.map((c) => channelUnit(c.id))).map((unit, i) => ({
      scale: unit, label: axisLabel(unit), values, side: i === 0 ? 3 : 1, grid: { show: i === 0 },
    }));
    const options: uPlot.Options = {
      width: 800, height: HEIGHT, series, bands, plugins: [wheelZoom()],
      scales: { x: { time: false } },
      axes: [{ label: axisLabel("s"), values }, ...yAxes],
      cursor: { drag: { x: true, y: false } },
      // One legend entry per channel below the chart, not a max and a min entry each.
      legend: { show: false },
    };
    return { options, data: data as uPlot.AlignedData };
  }, [preview, unitsKey]);
  const { ref, chart } = useUplot(build, HEIGHT);
  const pan = (direction: -1 | 1) => {
    const u = chart.current;
    const { min, max } = u?.scales.x ?? {};
    if (!u || min === undefined || max === undefined) return;
    const step = (max - min) * 0.5 * direction;
    u.setScale("x", { min: min + step, max: max + step });
  };
  const reset = () => {
    const u = chart.current;
    const t = preview.timeS;
    if (u && t.length > 0) u.setScale("x", { min: t[0] as number, max: t[t.length - 1] as number });
  };
  return (
    <figure data-testid="waveform-plot">
      <div className="mb-2 flex gap-2 text-xs">
        <button type="button" onClick={() => pan(-1)} className="rounded px-2 py-1 ring-1 ring-ink-200">← Pan</button>
        <button type="button" onClick={() => pan(1)} className="rounded px-2 py-1 ring-1 ring-ink-200">Pan →</button>
        <button type="button" onClick={reset} className="rounded px-2 py-1 ring-1 ring-ink-200">Whole record</button>
        <span className="self-center text-ink-600">Drag to zoom a span, wheel to zoom, double-click to reset.</span>
      </div>
      <div ref={ref} className="w-full" />
      <ChannelLegend channels={preview.channels.map((c, i) => ({ id: c.id, unit: unitOf(c.id), colour: CHANNEL_COLOURS[i % CHANNEL_COLOURS.length] as string }))} />
      <figcaption className="mt-1 text-xs text-ink-600">
        Min/max envelope of {preview.timeS.length.toLocaleString("en")} buckets per channel: every peak of the full record is kept.
      </figcaption>
    </figure>
  );
}
