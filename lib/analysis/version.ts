/** Bump whenever a change can alter any number in a report. */
export const ANALYSIS_VERSION = "2.2.0";
