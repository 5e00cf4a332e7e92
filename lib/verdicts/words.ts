import type { VerdictStatus } from "@/lib/analysis";

// One vocabulary for verdicts on every page, in CSV and PDF files and in the API's labels.
// Browser-safe: no server imports.

export const VERDICT_WORDS: Record<VerdictStatus, string> = {
  pass: "Within",
  marginal: "Near edge",
  inconclusive: "Inconclusive",
  fail: "Outside",
  "not-required": "Not required",
  // Only results from before engine 2.0.0 carry this.
  "not-applicable": "Not judged",
};

/** A word for a unit or capture that has no result at all yet. */
export const NO_RESULT_WORD = "No result yet";

export function verdictWord(status: VerdictStatus | null | undefined): string {
  return status ? VERDICT_WORDS[status] : NO_RESULT_WORD;
}
