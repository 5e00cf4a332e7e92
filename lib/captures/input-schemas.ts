import { z } from "zod";
import { instrumentRefsSchema } from "@/lib/instruments/input-schemas";
import { CHANNEL_ROLES } from "@/lib/analysis";

// Inputs of the upload flow, shared by the browser form, the session handlers and the bench API.
// Browser-safe: no server imports.

export const TEST_KINDS = ["no-load", "load", "back-emf", "other"] as const;
export const TEST_KIND_LABELS: Record<(typeof TEST_KINDS)[number], string> = {
  "no-load": "No-load (open circuit)", load: "Load", "back-emf": "Back-EMF (PM, driven)", other: "Other",
};

/** What a capture file may be called: the instruments' CSV exports. */
export const CAPTURE_FILE_NAME = /\.(csv|txt|tsv)$/i;
const MAX_CHANNELS = 8;

export const channelRolesSchema = z
  .record(z.string().min(1).max(120), z.enum(CHANNEL_ROLES))
  .refine((r) => Object.keys(r).length <= MAX_CHANNELS, `At most ${MAX_CHANNELS} channels`);

export const probeScalesSchema = z
  .record(z.string().min(1).max(120), z.number().positive().finite().max(1e6))
  .refine((r) => Object.keys(r).length <= MAX_CHANNELS, `At most ${MAX_CHANNELS} channels`);

export const captureRegistrationSchema = z.object({
  unitSerial: z.string().trim().min(1, "Give the unit's serial number").max(64).regex(/^[\w./-]+$/, "Serial numbers use letters, digits, - _ . / only"),
  /** Registers the unit with this rating when the serial is not known yet. */
  newUnitRatingId: z.uuid().optional(),
  /** A new serial is registered only when this confirms it is not a typo of one on file. */
  confirmNewUnit: z.boolean().optional(),
  testKind: z.enum(TEST_KINDS),
  speedRpm: z.number({ error: "Shaft speed must be a number" }).finite().min(1, "Shaft speed starts at 1 rpm").max(200_000, "Shaft speed is above 200 000 rpm").nullable().optional(),
  channelRoles: channelRolesSchema.default({}),
  probeScales: probeScalesSchema.default({}),
  /** Added after the probe ratio, volts or amps per column (an import profile's offsets). */
  channelOffsets: z
    .record(z.string().min(1).max(120), z.number({ error: "Offsets are numbers of volts or amps" }).finite().min(-1e6).max(1e6))
    .refine((r) => Object.keys(r).length <= MAX_CHANNELS, `At most ${MAX_CHANNELS} channels`)
    .default({}),
  /** Time base for a file without a time column, or with a sample-index column, Hz. */
  sampleRateHz: z.number({ error: "The sample rate is a number of Hz" }).positive("The sample rate must be positive").max(1e10).nullable().optional(),
  stationId: z.uuid().optional(),
  /** Instrument ids or asset tags that took the capture (optionally { instrument, channel }); absent: the bench's default set. */
  instruments: instrumentRefsSchema.optional(),
  notes: z.string().max(2000).default(""),
  fileName: z.string().trim().min(1).max(255).regex(CAPTURE_FILE_NAME, "Only CSV exports are accepted (.csv, .txt or .tsv)"),
  sizeBytes: z.number().int().positive("The file is empty"),
  sha256: z.string().regex(/^[0-9a-f]{64}$/, "sha256 must be 64 lower-case hex digits"),
});

export type CaptureRegistration = z.input<typeof captureRegistrationSchema>;

const partNumber = z.number({ error: "partNumber is a whole number from 1" }).int("partNumber is a whole number from 1").min(1, "partNumber is a whole number from 1").max(10_000, "At most 10 000 parts");
const partSha256 = z.string({ error: "sha256 of the part is required" }).regex(/^[0-9a-f]{64}$/, "A part's sha256 must be 64 lower-case hex digits");

export const completeUploadSchema = z.object({
  /** Each part's ETag as the store answered it, and the sha256 the part was sent with. */
  parts: z.array(z.object({ partNumber, etag: z.string().min(1, "etag is required").max(200), sha256: partSha256.optional() })).max(10_000).optional(),
});

/** Part URLs are issued for parts whose sha256 the client computed: each URL carries it and the part's length. */
export const presignPartsSchema = z.object({
  parts: z.array(z.object({ partNumber, sha256: partSha256 }), { error: "parts is a list of { partNumber, sha256 }" })
    .min(1, "Ask for at least one part").max(200, "Ask for at most 200 parts at a time"),
});

export type UploadPlan =
  | { kind: "single"; method: "PUT"; url: string; headers: Record<string, string>; expiresInS: number }
  | { kind: "multipart"; partSize: number; partCount: number; expiresInS: number };

/** A part URL and the headers to send with it (the part's checksum, bound by the signature). */
export type PartUrl = { partNumber: number; url: string; headers: Record<string, string> };

/** Offsets added after scaling, in volts or amps, per column header. */
export const channelOffsetsSchema = z
  .record(z.string().min(1).max(120), z.number().finite().min(-1e6).max(1e6))
  .refine((r) => Object.keys(r).length <= MAX_CHANNELS, `At most ${MAX_CHANNELS} channels`);

/**
 * A correction of a capture's settings after upload. Only the fields given change; a reason is
 * always recorded, and the capture is analysed again with the new settings.
 */
export const captureCorrectionSchema = z.object({
  channelRoles: channelRolesSchema.optional(),
  probeScales: probeScalesSchema.optional(),
  channelOffsets: channelOffsetsSchema.optional(),
  speedRpm: z.number().min(1, "Shaft speed starts at 1 rpm").max(200_000).nullable().optional(),
  testKind: z.enum(TEST_KINDS).optional(),
  /** null: match the plan step from test kind and speed. */
  planStepId: z.uuid().nullable().optional(),
  magnetTemperatureC: z.number().min(-60).max(250).nullable().optional(),
  reason: z.string().trim().min(5, "Say why the settings change (at least 5 characters)").max(1000),
});
export type CaptureCorrection = z.input<typeof captureCorrectionSchema>;
export const CORRECTABLE_FIELDS = ["channelRoles", "probeScales", "channelOffsets", "speedRpm", "testKind", "planStepId", "magnetTemperatureC"] as const;
