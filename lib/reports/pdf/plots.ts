import { z } from "zod";
import { CONTENT_WIDTH, INK, MUTED, PAGE, RULE, ensureSpace, type Doc } from "./document";

// The waveform and spectrum of a capture of record, drawn as vector paths from the stored preview
// (min/max envelope) and spectrum (harmonic RMS per order). Nothing is rasterised.

const finiteList = z.array(z.number());
export const previewSchema = z.object({
  timeS: finiteList,
  channels: z.array(z.object({ id: z.string(), min: finiteList, max: finiteList })),
});
export const spectrumSchema = z.object({
  frequencyHz: z.number().optional(),
  channels: z.array(z.object({ id: z.string(), unit: z.string().optional(), orders: z.array(z.number()), rms: finiteList })),
});
export type PlotData = { preview: z.infer<typeof previewSchema> | null; spectrum: z.infer<typeof spectrumSchema> | null };

const COLOURS = ["#b35c1e", "#1f5f8b", "#3c7d3a", "#7a3b8f", "#8a6d1a", "#444444"];
const PLOT_HEIGHT = 120;
const BLOCK = PLOT_HEIGHT + 46;
/** Points per channel drawn in the PDF: enough for the page width. */
const MAX_POINTS = 600;

const nice = (n: number) => String(Number(n.toPrecision(3)));

function frame(doc: Doc, x: number, y: number, w: number, h: number, title: string): void {
  doc.font("bold").fontSize(8.5).fillColor(INK).text(title, x, y - 14, { width: w, lineBreak: false });
  doc.rect(x, y, w, h).lineWidth(0.5).strokeColor(RULE).stroke();
}

function legend(doc: Doc, x: number, y: number, names: string[]): void {
  let cx = x;
  names.forEach((name, i) => {
    doc.rect(cx, y + 2, 8, 4).fill(COLOURS[i % COLOURS.length] as string);
    doc.font("regular").fontSize(7).fillColor(MUTED).text(name, cx + 11, y, { lineBreak: false });
    cx += 14 + doc.widthOfString(name) + 10;
  });
}

const lowest = (a: number, b: number) => Math.min(a, b);
const highest = (a: number, b: number) => Math.max(a, b);

/** At most MAX_POINTS values, each the lowest or highest of its bucket, so peaks survive. */
export function decimate(values: readonly number[], reduce: (a: number, b: number) => number): number[] {
  if (values.length <= MAX_POINTS) return [...values];
  const step = values.length / MAX_POINTS;
  return Array.from({ length: MAX_POINTS }, (_, i) => values.slice(Math.floor(i * step), Math.max(Math.floor(i * step) + 1, Math.floor((i + 1) * step))).reduce(reduce));
}

function drawWaveform(doc: Doc, preview: PlotData["preview"], units: Map<string, string>, x: number, y: number, w: number): void {
  frame(doc, x, y, w, PLOT_HEIGHT, "Waveform (min/max envelope)");
  if (!preview || preview.timeS.length < 2 || preview.channels.length === 0) {
    doc.font("regular").fontSize(8).fillColor(MUTED).text("No stored waveform for this capture.", x + 6, y + PLOT_HEIGHT / 2, { width: w - 12 });
    return;
  }
  const t = decimate(preview.timeS, lowest);
  const series = preview.channels.map((c) => ({ id: c.id, min: decimate(c.min, lowest), max: decimate(c.max, highest) }));
  const all = series.flatMap((s) => [...s.min, ...s.max]).filter(Number.isFinite);
  const peak = Math.max(1e-12, ...all.map(Math.abs));
  const t0 = t[0] as number;
  const span = Math.max(1e-12, (t[t.length - 1] as number) - t0);
  const px = (ti: number) => x + ((ti - t0) / span) * w;
  const py = (v: number) => y + PLOT_HEIGHT / 2 - (v / peak) * (PLOT_HEIGHT / 2 - 4);
  doc.moveTo(x, py(0)).lineTo(x + w, py(0)).lineWidth(0.3).strokeColor(RULE).stroke();
  series.forEach((s, i) => {
    const colour = COLOURS[i % COLOURS.length] as string;
    for (const line of [s.max, s.min]) {
      // A point that is not finite (or has no time) breaks the line there instead of reaching the PDF.
      let open = false;
      line.forEach((v, k) => {
        const ti = t[k];
        if (ti === undefined || !Number.isFinite(v) || !Number.isFinite(ti)) return void (open = false);
        if (open) doc.lineTo(px(ti), py(v));
        else doc.moveTo(px(ti), py(v));
        open = true;
      });
      doc.lineWidth(0.6).strokeColor(colour).stroke();
    }
  });
  const unit = units.get(series[0]?.id ?? "") ?? "";
  doc.font("regular").fontSize(7).fillColor(MUTED)
    .text(`±${nice(peak)} ${unit}`, x + 3, y + 2, { lineBreak: false })
    .text(`${nice(span * 1000)} ms`, x + w - 60, y + PLOT_HEIGHT + 3, { width: 60, align: "right", lineBreak: false });
  legend(doc, x, y + PLOT_HEIGHT + 3, series.map((s) => s.id));
}

function drawSpectrum(doc: Doc, spectrum: PlotData["spectrum"], x: number, y: number, w: number): void {
  frame(doc, x, y, w, PLOT_HEIGHT, "Harmonics, % of fundamental (orders 2 and up)");
  const channels = (spectrum?.channels ?? []).filter((c) => c.orders.length > 1 && (c.rms[0] ?? 0) > 0);
  if (channels.length === 0) {
    doc.font("regular").fontSize(8).fillColor(MUTED).text("No stored spectrum for this capture.", x + 6, y + PLOT_HEIGHT / 2, { width: w - 12 });
    return;
  }
  const maxOrder = Math.min(50, Math.max(...channels.flatMap((c) => c.orders)));
  const percent = (c: (typeof channels)[number], k: number) => (100 * (c.rms[k] ?? 0)) / (c.rms[0] as number);
  const top = Math.max(0.1, ...channels.flatMap((c) => c.orders.map((o, k) => (o > 1 && o <= maxOrder ? percent(c, k) : 0))).filter(Number.isFinite));
  const slot = w / Math.max(1, maxOrder - 1);
  const bar = Math.max(0.4, (slot * 0.8) / channels.length);
  channels.forEach((c, ci) => {
    const colour = COLOURS[ci % COLOURS.length] as string;
    c.orders.forEach((order, k) => {
      if (order < 2 || order > maxOrder) return;
      const h = (percent(c, k) / top) * (PLOT_HEIGHT - 8);
      if (Number.isFinite(h) && h > 0.05) doc.rect(x + (order - 2) * slot + slot * 0.1 + ci * bar, y + PLOT_HEIGHT - h, bar, h).fill(colour);
    });
  });
  doc.font("regular").fontSize(7).fillColor(MUTED)
    .text(`${nice(top)} %`, x + 3, y + 2, { lineBreak: false })
    .text(`order ${maxOrder}`, x + w - 60, y + PLOT_HEIGHT + 3, { width: 60, align: "right", lineBreak: false });
  legend(doc, x, y + PLOT_HEIGHT + 3, channels.map((c) => c.id));
}

/** Waveform and spectrum side by side, kept together on one page. */
export function drawStepPlots(doc: Doc, data: PlotData): void {
  ensureSpace(doc, BLOCK);
  const y = doc.y + 16;
  const w = (CONTENT_WIDTH - 16) / 2;
  const units = new Map((data.spectrum?.channels ?? []).map((c) => [c.id, c.unit ?? ""]));
  drawWaveform(doc, data.preview, units, PAGE.left, y, w);
  drawSpectrum(doc, data.spectrum, PAGE.left + w + 16, y, w);
  doc.fillColor(INK);
  doc.x = PAGE.left;
  doc.y = y + PLOT_HEIGHT + 24;
}

export function parsePlotData(preview: unknown, spectrum: unknown): PlotData {
  const p = previewSchema.safeParse(preview);
  const s = spectrumSchema.safeParse(spectrum);
  return { preview: p.success ? p.data : null, spectrum: s.success ? s.data : null };
}
