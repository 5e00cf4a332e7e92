import { z } from "zod";
import { captureRegistrationSchema, channelRolesSchema, probeScalesSchema } from "./input-schemas";

// Import profiles: what an operator confirmed for one header layout on one bench. Browser-safe.

export const channelOffsetsSchema = captureRegistrationSchema.shape.channelOffsets.removeDefault();
export const sampleRateSchema = captureRegistrationSchema.shape.sampleRateHz.unwrap().unwrap();

export const importProfileSettingsSchema = z.object({
  channelRoles: channelRolesSchema.default({}),
  probeScales: probeScalesSchema.default({}),
  channelOffsets: channelOffsetsSchema.default({}),
  sampleRateHz: sampleRateSchema.nullable().default(null),
});

export type ImportProfileSettings = z.output<typeof importProfileSettingsSchema>;

export const headerSignatureSchema = z.string().regex(/^h1-[0-9a-f]{16}$/, "Not a header signature");

/** GET /api/import-profiles?stationId=…&signature=… */
export const importProfileLookupSchema = z.object({
  stationId: z.uuid("Give the bench"),
  signature: headerSignatureSchema,
});

/** The bench page's edit form: one JSON text per field, as the form posts it. */
export const importProfileEditSchema = z.object({
  profileId: z.uuid("Unknown profile"),
  settings: z.string().max(20_000, "The settings are too long").transform((text, ctx) => {
    try {
      return JSON.parse(text) as unknown;
    } catch {
      ctx.addIssue({ code: "custom", message: "The settings are not valid JSON" });
      return z.NEVER;
    }
  }).pipe(importProfileSettingsSchema),
});

export const importProfileRemoveSchema = z.object({ profileId: z.uuid("Unknown profile") });

/** Settings worth remembering: something was confirmed beyond the defaults. */
export function hasSettings(settings: ImportProfileSettings): boolean {
  return Object.keys(settings.channelRoles).length > 0 || Object.keys(settings.probeScales).length > 0 || Object.keys(settings.channelOffsets).length > 0 || settings.sampleRateHz !== null;
}
