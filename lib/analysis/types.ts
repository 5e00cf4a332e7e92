export const CHANNEL_ROLES = ["v", "van", "vbn", "vcn", "vab", "vbc", "vca", "ia", "ib", "ic"] as const;
export type ChannelRole = (typeof CHANNEL_ROLES)[number];

export type SiUnit = "V" | "A";

export interface QualityWarning {
  code: string;
  message: string;
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
