"use client";

import "uplot/dist/uPlot.min.css";
import { useCallback, useState } from "react";
import uPlot from "uplot";
import type { SpectrumView } from "@/lib/dal/captures";
import { axisLabel, tickLabels } from "./axes";
import { CHANNEL_COLOURS, useUplot } from "./use-uplot";

const HEIGHT = 260;

/** Harmonics 2..H of one channel as bars, in percent of its fundamental. */
export function SpectrumPlot({ spectrum }: { spectrum: SpectrumView }) {
  const [index, setIndex] = useState(0);
  const channel = spectrum.channels[index] ?? spectrum.channels[0];
  const build = useCallback(() => {
    if (!channel) return null;
    const fundamental = channel.rms[0] ?? 0;
    const orders = channel.orders.slice(1);
    const percent = channel.rms.slice(1).map((v) => (fundamental > 0 ? (100 * v) / fundamental : 0));
    const colour = CHANNEL_COLOURS[index % CHANNEL_COLOURS.length] as string;
    const options: uPlot.Options = {
      width: 800, height: HEIGHT,
      scales: { x: { time: false, range: (_u, min, max) => [min - 1, max + 1] }, y: { range: (_u, _min, max) => [0, Math.max(max * 1.1, 0.1)] } },
      series: [
        { label: "Order" },
        { label: `${channel.id} (% of fundamental)`, stroke: colour, fill: `${colour}99`, paths: uPlot.paths.bars?.({ size: [0.7, 40] }), points: { show: false } },
      ],
      axes: [{ label: "Harmonic order", values: (_u, splits) => tickLabels(splits) }, { label: axisLabel("%", "Harmonic RMS relative to the fundamental"), values: (_u, splits) => tickLabels(splits) }],
      legend: { live: true },
    };
    return { options, data: [orders, percent] as uPlot.AlignedData };
  }, [channel, index]);
  const { ref } = useUplot(build, HEIGHT);
  return (
    <figure data-testid="spectrum-plot">
      <label className="mb-2 block text-xs">
        <span className="mr-2 font-semibold">Channel</span>
        <select value={index} onChange={(e) => setIndex(Number(e.target.value))} className="rounded border border-ink-200 px-2 py-1">
          {spectrum.channels.map((c, i) => <option key={c.id} value={i}>{c.id}</option>)}
        </select>
      </label>
      <div ref={ref} className="w-full" />
      <figcaption className="mt-1 text-xs text-ink-600">Fundamental {spectrum.frequencyHz.toFixed(3)} Hz; bars are harmonic RMS over the analysed whole cycles.</figcaption>
    </figure>
  );
}
