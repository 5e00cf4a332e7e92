export const CHANNEL_ROLES = ["v", "van", "vbn", "vcn", "vab", "vbc", "vca", "ia", "ib", "ic"] as const;
export type ChannelRole = (typeof CHANNEL_ROLES)[number];

export type SiUnit = "V" | "A";

/** How a warning is shown: "alert" prominently (plausibility), "info" as a plain note. Absent: a warning. */
export type WarningLevel = "info" | "warning" | "alert";

export interface QualityWarning {
  code: string;
  /** The sentence people read; it is also the reason of every check it makes inconclusive. */
  message: string;
  level?: WarningLevel;
  /** Check ids (see tolerance.ts CHECK_IDS) whose figures this warning invalidates. */
  invalidates?: string[];
  /** The channel (column header) it is about; it invalidates a check only when that channel feeds it. */
  channel?: string;
}

/** A probe ratio applied to a channel at parse time, and where it came from. */
export interface AppliedProbeScale {
  channel: string;
  scale: number;
  from: "caller" | "preamble";
  /** The preamble line as read (key and value), for a ratio taken from the file. */
  statement: string | null;
}

export interface CaptureChannel {
  /** The column header exactly as written in the file. */
  id: string;
  unit: SiUnit;
  samples: Float64Array;
}

export interface ParsedCapture {
  sampleRateHz: number;
  sampleCount: number;
  timeStartS: number;
  channels: CaptureChannel[];
  metadata: Record<string, string>;
  warnings: QualityWarning[];
  /** Probe ratios applied while parsing (caller's or the preamble's); absent when none. */
  probeScales?: AppliedProbeScale[];
}

export interface ChannelCalibration {
  /** Probe ratio: the SI value is multiplied by it (a 100:1 probe recorded at 1:1 needs 100). */
  scale?: number;
  /** Added after scaling, in SI units. */
  offset?: number;
}

export interface ParseOptions {
  /** Keyed by the column header as written. */
  calibration?: Record<string, ChannelCalibration>;
  /** Reject once more bytes than this arrive. Default 2 GiB. */
  maxBytes?: number;
  /** Largest allowed departure of one time step from the mean step, as a fraction. Default 0.25. */
  timeStepTolerance?: number;
  /** Sample rate to use when the file has neither a time column nor a rate in its preamble. */
  sampleRateHz?: number;
  /** Size of the whole input when known (file size, object length): lets storage be sized once. */
  expectedBytes?: number;
  /** "fast" is the byte-level parser; "reference" runs the body through papaparse. Same results. */
  engine?: "fast" | "reference";
}
