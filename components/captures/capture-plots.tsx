"use client";

import { useQuery } from "@tanstack/react-query";
import { SpectrumPlot } from "@/components/plots/spectrum-plot";
import { WaveformPlot } from "@/components/plots/waveform-plot";
import { captureKeys, fetchCapturePlot } from "./fetchers";

/** Fetches the stored envelope and spectrum once the capture is analysed. */
export function CapturePlots({ captureId, analysedAt, units = {} }: { captureId: string; analysedAt: string | null; units?: Record<string, "V" | "A"> }) {
  const unitsKey = Object.entries(units).map(([id, unit]) => `${id}=${unit}`).join(",");
  const query = useQuery({ queryKey: [...captureKeys.plot(captureId), analysedAt], queryFn: () => fetchCapturePlot(captureId), staleTime: Infinity });
  if (query.error) return <p className="text-sm text-outside-700">{query.error.message}</p>;
  if (!query.data) return <p className="text-sm text-ink-600">Loading the plots…</p>;
  return (
    <div className="space-y-6">
      <section className="rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200">
        <h2 className="mb-2 text-lg font-semibold">Waveform</h2>
        <WaveformPlot preview={query.data.preview} unitsKey={unitsKey} />
      </section>
      <section className="rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200">
        <h2 className="mb-2 text-lg font-semibold">Harmonic spectrum</h2>
        <SpectrumPlot spectrum={query.data.spectrum} />
      </section>
    </div>
  );
}
