import type { RunRule } from "@/lib/analysis";

/** One unit's figure of record on a trend. */
export type TrendPoint = {
  unitId: string;
  serial: string;
  captureId: string;
  measuredAt: string;
  value: number;
  status: string | null;
  /** Inconclusive or warned: drawn apart, left out of the statistics. */
  flagged: boolean;
  testKind: string;
  bench: string | null;
  /** Western Electric rules this point completes (points in the statistics only). */
  rules: RunRule[];
  /** Expanded uncertainty (k = 2) where an uncertainty budget was evaluated; null until then. */
  expandedUncertainty: number | null;
};
