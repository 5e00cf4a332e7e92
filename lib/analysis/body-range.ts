/**
 * Pieces for parsing one capture in several byte ranges (in parallel, by a caller that owns the
 * threads): the layout of the body from the file's head, a parser for one range of whole lines
 * writing into caller-provided arrays, and the join of the ranges into a ParsedCapture.
 *
 * The split path is only for clean captures. Anything the single pass would treat specially (an
 * empty cell, a time stamp that does not increase, any rejection, a range that outgrows its
 * arrays) makes a range throw `BodyRangeFallback`, and the caller re-reads the file on the single
 * pass, which gives the exact rejection or result. For clean captures the values, sample rate,
 * warnings and irregular-time rejection are those of createCaptureParser: prepareBodyLayout mirrors
 * its `start`, RangeSink mirrors ColumnSink's gap-free path, joinBodyRanges mirrors
 * ColumnSink.finish and `assemble`. tests/unit/server/parallel-ingest.test.ts pins the equality.
 * No I/O, no threads.
 */
import { columnProbeScales } from "./probe-preamble";
import { MAX_SAMPLE_MAGNITUDE, type ColumnSink } from "./column-sink";
import { createFastBodyParser } from "./fast-body-parser";
import { CaptureRejection } from "./rejection";
import { judgeTimeSteps, TimeTrack } from "./time-steps";
import { sniffLines, type CaptureLayout } from "./sniff";
import { siUnitFor } from "./units";
import type { ParsedCapture, ParseOptions, QualityWarning } from "./types";

/** The head createCaptureParser sniffs when chunks are 1 MiB: exactly its first chunk. */
export const BODY_HEAD_BYTES = 1 << 20;
const HEAD_LINES = 64;
const MIN_SAMPLES = 16;

/** Thrown by a range (or the join) when the single pass must decide instead. */
export class BodyRangeFallback extends Error {
  constructor(readonly reason: string) {
    super(`body range: ${reason}`);
    this.name = "BodyRangeFallback";
  }
}

/** Everything a range parser needs; plain data, so it can be posted to another thread. */
export interface BodyRangeLayout {
  delimiter: string;
  decimal: "." | ",";
  headers: string[];
  /** Per column: raw × factor + offset (unit prefix × probe ratio, calibration offset). */
  factors: number[];
  offsets: number[];
  timeColumn: number | null;
  timeFactor: number;
}

export interface PreparedBody {
  layout: CaptureLayout;
  range: BodyRangeLayout;
  /** Byte offset of the first body line in the file. */
  bodyOffset: number;
  /** 1-based file line of the first body line. */
  firstLine: number;
  /** Mean bytes per row over the sampled head rows. */
  bytesPerRow: number;
}

function rejectsAsBinary(head: Uint8Array): boolean {
  let control = 0;
  for (let i = 0; i < head.length; i++) {
    const byte = head[i] as number;
    if (byte === 0) return true;
    if (byte < 32 && byte !== 9 && byte !== 10 && byte !== 13) control++;
  }
  return control > Math.max(8, head.length / 100);
}

/**
 * The layout createCaptureParser derives from `head`, the first BODY_HEAD_BYTES of a longer file.
 * Throws BodyRangeFallback where the single pass would reject or read further.
 */
export function prepareBodyLayout(head: Uint8Array, options: ParseOptions = {}): PreparedBody {
  if (head.length !== BODY_HEAD_BYTES) throw new BodyRangeFallback("head is not one full chunk");
  if (rejectsAsBinary(head)) throw new BodyRangeFallback("binary");
  const decoder = new TextDecoder();
  const lines: string[] = [];
  const starts: number[] = [];
  let start = 0;
  while (lines.length < HEAD_LINES) {
    const newline = head.indexOf(10, start);
    if (newline < 0) break;
    starts.push(start);
    lines.push(decoder.decode(head.subarray(start, newline)).replace(/\r$/, ""));
    start = newline + 1;
  }
  if (lines[0] !== undefined) lines[0] = lines[0].replace(/^\uFEFF/, "");
  let layout: CaptureLayout;
  try {
    layout = sniffLines(lines);
  } catch {
    throw new BodyRangeFallback("layout");
  }
  if (layout.leadingColumns > 0 || layout.timeIsIndex) throw new BodyRangeFallback("leading metadata columns or a sample-index column");
  const bodyOffset = starts[layout.dataStartIndex] ?? head.length;
  const lastStart = starts[starts.length - 1] ?? bodyOffset;
  const sampledRows = starts.length - 1 - layout.dataStartIndex;
  const bytesPerRow = sampledRows > 0 ? Math.max(1, (lastStart - bodyOffset) / sampledRows) : 64;
  const probes = columnProbeScales(layout, options.calibration);
  const factors = layout.headers.map((_, index) => (layout.units[index]?.factor ?? 1) * (probes.scales[index] ?? 1));
  const offsets = layout.headers.map((header) => options.calibration?.[header]?.offset ?? 0);
  const timeFactor = layout.timeColumn !== null ? (layout.units[layout.timeColumn]?.factor ?? 1) : 1;
  return {
    layout,
    range: { delimiter: layout.delimiter, decimal: layout.decimal, headers: layout.headers, factors, offsets, timeColumn: layout.timeColumn, timeFactor },
    bodyOffset,
    firstLine: layout.dataStartIndex + 1,
    bytesPerRow,
  };
}

/** What a finished range knows; line numbers are those the range was started with. */
export interface BodyRangeSummary {
  count: number;
  /** Line of the last accepted row (0 without rows). */
  lastLine: number;
  firstLine: number;
  timeFirst: number;
  timeLast: number;
  minStep: number;
  minStepLine: number;
  maxStep: number;
  maxStepLine: number;
}

/** ColumnSink's gap-free path, writing to `stores[c][base + n]` for n below `limit`. */
class RangeSink {
  private count = 0;
  private firstLine = 0;
  private lastLine = 0;
  private readonly time = new TimeTrack();
  private readonly width: number;
  private readonly timeIndex: number;
  private readonly factors: Float64Array;
  private readonly offsets: Float64Array;

  constructor(
    private readonly layout: BodyRangeLayout,
    /** One array per column; the time column's entry is not written. */
    private readonly stores: Float64Array[],
    private readonly base: number,
    private limit: number,
  ) {
    this.width = layout.headers.length;
    this.timeIndex = layout.timeColumn ?? -1;
    this.factors = Float64Array.from(layout.factors);
    this.offsets = Float64Array.from(layout.offsets);
  }

  setLimit(limit: number): void {
    if (this.count > limit) throw new BodyRangeFallback("range outgrew its arrays");
    this.limit = limit;
  }

  get rows(): number {
    return this.count;
  }

  accept(row: Float64Array, line: number, filled: number): void {
    const width = this.width;
    if (filled < width) throw new BodyRangeFallback("empty cell");
    const n = this.count;
    if (n >= this.limit) throw new BodyRangeFallback("range outgrew its arrays");
    const at = this.base + n;
    const stores = this.stores;
    const factors = this.factors;
    const offsets = this.offsets;
    const timeColumn = this.timeIndex;
    for (let c = 0; c < width; c++) {
      if (c === timeColumn) continue;
      const value = (row[c] as number) * (factors[c] as number) + (offsets[c] as number);
      if (!(value <= MAX_SAMPLE_MAGNITUDE && value >= -MAX_SAMPLE_MAGNITUDE)) throw new BodyRangeFallback("value out of range");
      (stores[c] as Float64Array)[at] = value;
    }
    if (timeColumn >= 0 && !this.time.accept((row[timeColumn] as number) * this.layout.timeFactor, line)) {
      throw new BodyRangeFallback("time not increasing");
    }
    if (n === 0) this.firstLine = line;
    this.count = n + 1;
    this.lastLine = line;
  }

  summary(): BodyRangeSummary {
    return {
      count: this.count,
      lastLine: this.lastLine,
      firstLine: this.firstLine,
      timeFirst: this.time.first,
      timeLast: this.time.last,
      minStep: this.time.minStep,
      minStepLine: this.time.minStepLine,
      maxStep: this.time.maxStep,
      maxStepLine: this.time.maxStepLine,
    };
  }
}

export interface BodyRangeParser {
  /** Whole or partial lines, in file order, chunked as the single pass chunks them. */
  push(chunk: Uint8Array): void;
  finish(): BodyRangeSummary;
  /** Rows accepted so far. */
  readonly rows: number;
  /** Caps the rows this range may write (throws BodyRangeFallback if already past it). */
  setLimit(limit: number): void;
}

/**
 * Parses a range of body lines with the same byte parser as createCaptureParser; `firstLine` is
 * the number given to the range's first line. Rejections become BodyRangeFallback.
 */
export function createBodyRangeParser(
  layout: BodyRangeLayout,
  firstLine: number,
  stores: Float64Array[],
  base: number,
  limit: number,
): BodyRangeParser {
  const sink = new RangeSink(layout, stores, base, limit);
  const body = createFastBodyParser(sink as unknown as ColumnSink, layout.headers, layout.delimiter, layout.decimal, firstLine);
  const guard = <T>(run: () => T): T => {
    try {
      return run();
    } catch (error) {
      if (error instanceof CaptureRejection) throw new BodyRangeFallback(`rejection ${error.code}`);
      throw error;
    }
  };
  return {
    push: (chunk) => guard(() => body.push(chunk)),
    finish: () => guard(() => {
      body.finish();
      return sink.summary();
    }),
    get rows() {
      return sink.rows;
    },
    setLimit: (value) => sink.setLimit(value),
  };
}

/**
 * Joins consecutive ranges (summaries with file line numbers) whose rows sit back to back in
 * `channels` (one array per non-time column, each holding at least the total count): the result of
 * ColumnSink.finish and `assemble` for the whole body.
 */
export function joinBodyRanges(
  prepared: PreparedBody,
  ranges: readonly BodyRangeSummary[],
  channels: Float64Array[],
  options: ParseOptions = {},
): ParsedCapture {
  const { layout } = prepared;
  let count = 0;
  const time = new TimeTrack();
  for (const range of ranges) {
    if (range.count === 0) continue;
    // The step across the seam is taken where the single pass takes it: on the range's first line.
    const track = { first: range.timeFirst, last: range.timeLast, ...range };
    if (layout.timeColumn !== null && !time.append(track, range.firstLine)) throw new BodyRangeFallback("time not increasing at a seam");
    count += range.count;
  }
  const probes = columnProbeScales(layout, options.calibration);
  // The same whole-column judgement as ColumnSink.finish.
  let warnings: QualityWarning[] = [];
  let sinkRateHz: number | null = null;
  if (layout.timeColumn !== null && count >= 2) {
    ({ sampleRateHz: sinkRateHz, warnings } = judgeTimeSteps(time.stats(count), options.timeStepTolerance ?? 0.25, layout.headers[layout.timeColumn] ?? "time"));
  }
  // assemble: its rejections are left to the single pass.
  if (count < MIN_SAMPLES) throw new BodyRangeFallback("too few samples");
  const channelIndices = layout.headers.map((_, index) => index).filter((index) => index !== layout.timeColumn);
  if (channelIndices.length === 0) throw new BodyRangeFallback("no channels");
  const sampleRateHz = sinkRateHz ?? options.sampleRateHz ?? layout.preambleSampleRateHz;
  if (sampleRateHz === null || !(sampleRateHz > 0) || !Number.isFinite(sampleRateHz)) throw new BodyRangeFallback("no time base");
  const out = channelIndices.map((index, position) => {
    const header = layout.headers[index] as string;
    const unit = layout.units[index];
    if (!unit || unit.written === null) {
      warnings.push({ code: "unit-assumed", message: `Column "${header}" names no unit; assumed ${unit ? siUnitFor(unit) : "V"} without prefix` });
    }
    return { id: header, unit: unit ? siUnitFor(unit) : ("V" as const), samples: (channels[position] as Float64Array).subarray(0, count) };
  });
  return {
    sampleRateHz,
    sampleCount: count,
    timeStartS: layout.timeColumn !== null && count > 0 ? time.first : 0,
    channels: out,
    metadata: layout.metadata,
    warnings,
    ...(probes.applied.length > 0 ? { probeScales: probes.applied } : {}),
  };
}
