/** The one entry point of the analysis engine. Everything here is pure: no I/O, clock or randomness. */
export { ANALYSIS_VERSION } from "./version";
export { CaptureRejection, isCaptureRejection } from "./rejection";
export { CHANNEL_ROLES } from "./types";
export type { ChannelRole, ParsedCapture, ParseOptions, CaptureChannel, ChannelCalibration, QualityWarning, SiUnit } from "./types";
export { createCaptureParser, parseCaptureText } from "./capture-parser";
export { sniffCaptureHeader } from "./sniff";
export { suggestChannelRoles } from "./roles";
export { analyseCapture } from "./analyse";
export { computeWaveformEnvelope } from "./envelope";
export { analysisReportSchema, verdictSchema, channelRoleSchema } from "./report-schema";
export type { AnalysisReport, ChannelReport, ThreePhaseReport, BackEmfReport, PowerReport, Verdict, VerdictStatus } from "./report-schema";
export { ratingSchema, type Rating } from "./rating";
export { toleranceProfileSchema, tolerancePresets, type ToleranceProfile } from "./tolerance";
export { analysisOptionsSchema, type AnalysisOptions } from "./options";
export { computeThd } from "./thd";
export { computeMaxDeviationUnbalance, computeVuf, computeVufFromLineMagnitudes, symmetricalComponents } from "./sequence";
export { MAGNET_COEFFICIENTS_PERCENT_PER_K, computeBackEmf, keAtReferenceTemperature, polesFromSpeed } from "./back-emf";
export { computeThf, computeTif } from "./telephone";
