import { ColumnSink, type SinkColumn } from "./column-sink";
import { createFastBodyParser, type BodyParser } from "./fast-body-parser";
import { columnProbeScales } from "./probe-preamble";
import { createReferenceBodyParser } from "./reference-body-parser";
import { CaptureRejection } from "./rejection";
import { checkHeadShape, splitHead } from "./head-lines";
import { sniffLines, type CaptureLayout } from "./sniff";
import { checkTextHead, createUtf8Transcoder, encodingOf } from "./text-encoding";
import { siUnitFor } from "./units";
import type { AppliedProbeScale, ParsedCapture, ParseOptions, QualityWarning } from "./types";

const HEAD_LINES = 64;
const HEAD_BYTES = 1 << 20;
const DEFAULT_MAX_BYTES = 2 * 1024 ** 3;
const MIN_SAMPLES = 16;
/** Rejections a longer head may cure (the data rows lie further down). */
const READ_FURTHER = new Set(["no-numeric-data", "quoted-newline"]);

function concat(chunks: Uint8Array[], total: number): Uint8Array {
  const out = new Uint8Array(total);
  let offset = 0;
  for (const chunk of chunks) {
    out.set(chunk, offset);
    offset += chunk.length;
  }
  return out;
}

/** Time of each row: the time column's value × factor + offset (an index column: × interval + start). */
function timeScale(layout: CaptureLayout, options: ParseOptions): { factor: number; offset: number } {
  if (layout.timeColumn === null) return { factor: 1, offset: 0 };
  if (!layout.timeIsIndex) return { factor: layout.units[layout.timeColumn]?.factor ?? 1, offset: 0 };
  const rate = options.sampleRateHz ?? layout.preambleSampleRateHz;
  if (rate === null || !(rate > 0) || !Number.isFinite(rate)) {
    throw new CaptureRejection(
      "no-time-base",
      `Column "${layout.headers[layout.timeColumn]}" counts samples, and the file states no sample interval or rate: give the sample rate`,
      { line: layout.dataStartIndex, column: layout.headers[layout.timeColumn] as string },
    );
  }
  return { factor: 1 / rate, offset: layout.statedStartS ?? 0 };
}

/**
 * Streaming capture parser: push chunks of bytes as they arrive, then call `finish`.
 * Only the first lines are buffered (to find the dialect and header); the body goes straight
 * into typed arrays. No chunk is kept after `push` returns, so callers may reuse one buffer.
 * Throws CaptureRejection for any input it cannot take.
 */
export function createCaptureParser(options: ParseOptions = {}): { push(chunk: Uint8Array): void; finish(): ParsedCapture } {
  const maxBytes = options.maxBytes ?? DEFAULT_MAX_BYTES;
  let received = 0;
  let headChunks: Uint8Array[] = [];
  let headBytes = 0;
  let headNewlines = 0;
  let headLineTarget = HEAD_LINES;
  let layout: CaptureLayout | null = null;
  let body: BodyParser | null = null;
  let sink: ColumnSink | null = null;
  let finished = false;
  const applied: AppliedProbeScale[] = [];

  function start(final: boolean): void {
    const head = concat(headChunks, headBytes);
    headChunks = [head];
    checkTextHead(head);
    checkHeadShape(head, final, HEAD_BYTES);
    const { lines, starts } = splitHead(head, final, headLineTarget);
    layout = sniffLines(lines);
    headChunks = [];
    const bodyOffset = starts[layout.dataStartIndex] ?? head.length;
    const lastStart = starts[starts.length - 1] ?? bodyOffset;
    const sampledRows = starts.length - 1 - layout.dataStartIndex;
    const bytesPerRow = sampledRows > 0 ? Math.max(1, (lastStart - bodyOffset) / sampledRows) : 64;
    const expectedRows = options.expectedBytes ? (options.expectedBytes - bodyOffset) / bytesPerRow : 0;
    const probes = columnProbeScales(layout, options.calibration);
    applied.push(...probes.applied);
    const columns: SinkColumn[] = layout.headers.map((header, index) => {
      const unitFactor = layout?.units[index]?.factor ?? 1;
      // The caller's ratio wins; else the one the preamble states for this channel.
      return { header, factor: unitFactor * (probes.scales[index] ?? 1), offset: options.calibration?.[header]?.offset ?? 0 };
    });
    const time = timeScale(layout, options);
    sink = new ColumnSink(columns, layout.timeColumn, time.factor, options.timeStepTolerance ?? 0.25, expectedRows * 1.02 + 1024, time.offset);
    const makeBody = options.engine === "reference" ? createReferenceBodyParser : createFastBodyParser;
    body = makeBody(sink, layout.headers, layout.delimiter, layout.decimal, layout.dataStartIndex + 1, layout.leadingColumns);
    body.push(head.subarray(bodyOffset));
  }

  let transcoder: ReturnType<typeof createUtf8Transcoder> | null = null;
  let encodingKnown = false;
  let prefix: Uint8Array | null = null;

  /** Settles the encoding from the byte-order mark once two bytes have arrived. */
  function decode(chunk: Uint8Array, final: boolean): Uint8Array {
    if (!encodingKnown) {
      const joined: Uint8Array = prefix ? concat([prefix, chunk], prefix.length + chunk.length) : chunk;
      if (joined.length < 2 && !final) {
        prefix = joined.slice();
        return new Uint8Array(0);
      }
      prefix = null;
      encodingKnown = true;
      const encoding = encodingOf(joined);
      if (encoding !== "utf-8") transcoder = createUtf8Transcoder(encoding);
      chunk = joined;
    }
    if (!transcoder) return chunk;
    const text = transcoder.push(chunk);
    if (!final) return text;
    const rest = transcoder.finish();
    return concat([text, rest], text.length + rest.length);
  }

  function pushText(chunk: Uint8Array): void {
      if (chunk.length === 0) return;
      if (body) {
        body.push(chunk);
        return;
      }
      // Copied: the caller may reuse its buffer for the next chunk.
      headChunks.push(chunk.slice());
      headBytes += chunk.length;
      for (let i = chunk.indexOf(10); i >= 0; i = chunk.indexOf(10, i + 1)) headNewlines++;
      if (headNewlines < headLineTarget && headBytes < HEAD_BYTES) return;
      try {
        start(false);
      } catch (error) {
        // A long preamble can hide the data rows: read further before giving up.
        if (!(error instanceof CaptureRejection && READ_FURTHER.has(error.code) && headBytes < HEAD_BYTES)) throw error;
        headLineTarget = headNewlines * 2;
      }
  }

  return {
    push(chunk: Uint8Array): void {
      if (finished) throw new Error("createCaptureParser: push after finish");
      received += chunk.length;
      if (received > maxBytes) {
        throw new CaptureRejection("oversize", `The file is larger than the ${Math.round(maxBytes / 1024 ** 2)} MiB allowed`);
      }
      pushText(decode(chunk, false));
    },
    finish(): ParsedCapture {
      if (finished) throw new Error("createCaptureParser: finish called twice");
      finished = true;
      pushText(decode(new Uint8Array(0), true));
      if (!body) {
        if (headBytes === 0) throw new CaptureRejection("empty", "The file is empty");
        start(true);
      }
      (body as BodyParser).finish();
      return { ...assemble(layout as CaptureLayout, (sink as ColumnSink).finish(), options), ...(applied.length > 0 ? { probeScales: applied } : {}) };
    },
  };
}

function assemble(layout: CaptureLayout, result: ReturnType<ColumnSink["finish"]>, options: ParseOptions): ParsedCapture {
  const warnings: QualityWarning[] = [...result.warnings];
  if (result.sampleCount < MIN_SAMPLES) {
    throw new CaptureRejection(
      "too-few-samples",
      `Only ${result.sampleCount} sample rows: at least ${MIN_SAMPLES} are needed`,
      { line: layout.dataStartIndex + 1 },
    );
  }
  const channelIndices = layout.headers.map((_, index) => index).filter((index) => index !== layout.timeColumn);
  if (channelIndices.length === 0) {
    throw new CaptureRejection("no-channels", "Only a time column was found: no channel to analyse", { line: layout.dataStartIndex });
  }
  let sampleRateHz = result.sampleRateHz;
  if (sampleRateHz === null) sampleRateHz = options.sampleRateHz ?? layout.preambleSampleRateHz;
  if (sampleRateHz === null || !(sampleRateHz > 0) || !Number.isFinite(sampleRateHz)) {
    throw new CaptureRejection(
      "no-time-base",
      "No time column and no sample interval or sample rate in the preamble: give the sample rate",
      { line: layout.dataStartIndex + 1 },
    );
  }
  const channels = channelIndices.map((index, position) => {
    const header = layout.headers[index] as string;
    const unit = layout.units[index];
    if (!unit || unit.written === null) {
      warnings.push({ code: "unit-assumed", message: `Column "${header}" names no unit; assumed ${unit ? siUnitFor(unit) : "V"} without prefix` });
    }
    return { id: header, unit: unit ? siUnitFor(unit) : ("V" as const), samples: result.channels[position] as Float64Array };
  });
  return {
    sampleRateHz,
    sampleCount: result.sampleCount,
    timeStartS: result.timeStartS ?? 0,
    channels,
    metadata: layout.metadata,
    warnings,
  };
}

/** Convenience for tests and small inputs: the same path as streaming, in one chunk. */
export function parseCaptureText(text: string, options: ParseOptions = {}): ParsedCapture {
  const parser = createCaptureParser(options);
  parser.push(new TextEncoder().encode(text));
  return parser.finish();
}
