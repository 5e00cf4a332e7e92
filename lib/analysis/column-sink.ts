import { CaptureRejection } from "./rejection";
import { judgeTimeSteps, TimeTrack } from "./time-steps";
import type { QualityWarning } from "./types";

export interface SinkColumn {
  header: string;
  /** Multiplies the raw value: unit prefix × probe ratio. */
  factor: number;
  offset: number;
}

export interface SinkResult {
  sampleCount: number;
  /** Views of exactly `sampleCount` values, one per channel column. */
  channels: Float64Array[];
  timeStartS: number | null;
  sampleRateHz: number | null;
  warnings: QualityWarning[];
}

const MIN_CAPACITY = 4096;
/** Largest magnitude taken as a sample, in V or A: beyond it sums of squares over a capture can overflow a double. */
export const MAX_SAMPLE_MAGNITUDE = 1e100;

/**
 * Receives parsed rows from either body parser and keeps the samples in typed arrays that
 * grow geometrically. Time stamps are checked as they arrive and are not stored: only the
 * first value, the step extremes and the line where each occurred are kept.
 */
export class ColumnSink {
  private readonly stores: Float64Array[];
  private count = 0;
  private capacity: number;
  private readonly firstMissingLine: number[];
  private readonly width: number;
  private readonly factors: Float64Array;
  private readonly offsets: Float64Array;
  /** Column index of time, −1 without one. */
  private readonly timeIndex: number;
  private gapSeen = false;
  private lastLine = 0;
  private readonly time = new TimeTrack();

  constructor(
    private readonly columns: readonly SinkColumn[],
    private readonly timeColumn: number | null,
    private readonly timeFactor: number,
    private readonly timeStepTolerance: number,
    initialCapacity: number,
    private readonly timeOffset = 0,
  ) {
    const capacity = Math.max(MIN_CAPACITY, Math.ceil(initialCapacity));
    this.capacity = capacity;
    this.stores = columns.map((_, index) => (index === timeColumn ? new Float64Array(0) : new Float64Array(capacity)));
    this.firstMissingLine = columns.map(() => -1);
    this.width = columns.length;
    this.factors = Float64Array.from(columns, (column) => column.factor);
    this.offsets = Float64Array.from(columns, (column) => column.offset);
    this.timeIndex = timeColumn ?? -1;
  }

  /** `row[c]` is NaN for an empty cell; `filled` says how many cells hold a value. */
  accept(row: Float64Array, line: number, filled: number): void {
    const n = this.count;
    if (n >= this.capacity) this.grow();
    const width = this.width;
    if (filled < width || this.gapSeen) {
      this.acceptWithGaps(row, line, n);
    } else {
      const stores = this.stores;
      const factors = this.factors;
      const offsets = this.offsets;
      const timeColumn = this.timeIndex;
      for (let c = 0; c < width; c++) {
        if (c === timeColumn) continue;
        const value = (row[c] as number) * (factors[c] as number) + (offsets[c] as number);
        if (!(value <= MAX_SAMPLE_MAGNITUDE && value >= -MAX_SAMPLE_MAGNITUDE)) this.rejectMagnitude(row[c] as number, line, c);
        (stores[c] as Float64Array)[n] = value;
      }
      if (timeColumn >= 0) this.acceptTime((row[timeColumn] as number) * this.timeFactor + this.timeOffset, line);
    }
    this.count = n + 1;
    this.lastLine = line;
  }

  /** Rows with empty cells: allowed only as a run of empties at the end of a column. */
  private acceptWithGaps(row: Float64Array, line: number, n: number): void {
    this.gapSeen = true;
    for (let c = 0; c < this.width; c++) {
      const value = row[c] as number;
      if (value !== value) {
        if (this.firstMissingLine[c] === -1) this.firstMissingLine[c] = line;
      } else if (this.firstMissingLine[c] !== -1) {
        throw new CaptureRejection("missing-value", "Empty cell between values: every row needs a value in every column", {
          line: this.firstMissingLine[c] as number,
          column: this.columns[c]?.header ?? `#${c + 1}`,
        });
      }
      if (c === this.timeIndex) {
        if (value === value) this.acceptTime(value * this.timeFactor + this.timeOffset, line);
      } else {
        const scaled = value * (this.factors[c] as number) + (this.offsets[c] as number);
        if (value === value && !(Math.abs(scaled) <= MAX_SAMPLE_MAGNITUDE)) this.rejectMagnitude(value, line, c);
        (this.stores[c] as Float64Array)[n] = scaled;
      }
    }
  }

  private rejectMagnitude(raw: number, line: number, c: number): never {
    throw new CaptureRejection(
      "value-out-of-range",
      `Value ${raw} is beyond ±${MAX_SAMPLE_MAGNITUDE.toExponential(0)} V or A once scaled: not a measurement (an overflowed or unscaled export?)`,
      { line, column: this.columns[c]?.header ?? `#${c + 1}` },
    );
  }

  private acceptTime(timeS: number, line: number): void {
    if (!this.time.accept(timeS, line)) {
      throw new CaptureRejection(
        "time-not-increasing",
        `Time stamps must increase: ${timeS} s follows ${this.time.last} s`,
        { line, column: this.columns[this.timeColumn as number]?.header ?? "time" },
      );
    }
  }

  private grow(): void {
    this.capacity = Math.ceil(this.capacity * 1.5);
    for (let c = 0; c < this.stores.length; c++) {
      if (c === this.timeColumn) continue;
      const old = this.stores[c] as Float64Array;
      const next = new Float64Array(this.capacity);
      next.set(old);
      this.stores[c] = next;
    }
  }

  finish(): SinkResult {
    for (let c = 0; c < this.columns.length; c++) {
      const missing = this.firstMissingLine[c] as number;
      if (missing !== -1) {
        throw new CaptureRejection(
          "unequal-length",
          `Channels have unequal length: this column stops at line ${missing - 1} while others continue to line ${this.lastLine}`,
          { line: missing, column: this.columns[c]?.header ?? `#${c + 1}` },
        );
      }
    }
    let warnings: QualityWarning[] = [];
    let sampleRateHz: number | null = null;
    if (this.timeColumn !== null && this.count >= 2) {
      ({ sampleRateHz, warnings } = judgeTimeSteps(this.time.stats(this.count), this.timeStepTolerance, this.columns[this.timeColumn]?.header ?? "time"));
    }
    return {
      sampleCount: this.count,
      channels: this.stores.flatMap((store, c) => (c === this.timeColumn ? [] : [store.subarray(0, this.count)])),
      timeStartS: this.timeColumn !== null && this.count > 0 ? this.time.first : null,
      sampleRateHz,
      warnings,
    };
  }
}
