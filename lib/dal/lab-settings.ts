import "server-only";
import { z } from "zod";
import { formatReportNumber, getLabSettings, prefixTakenByOtherLab, reportNumberUsed, updateLabSettings } from "@/db/queries/lab-settings";
import { HttpError } from "@/lib/auth/guards";
import type { Actor } from "./actor";
import { InputError } from "./setup-access";

// The lab's report numbering and the line printed under its name on reports; a lab manager edits them.

export const labSettingsSchema = z.object({
  reportPrefix: z.string({ error: "Give a prefix" }).trim().min(1, "Give a prefix, e.g. HL-").max(16, "A prefix is at most 16 characters")
    .regex(/^[A-Za-z0-9._-]+$/, "A prefix has letters, digits, dots, dashes and underscores only (it is part of the verification address)"),
  nextReportNumber: z.coerce.number({ error: "The next number must be a whole number" }).int("The next number must be a whole number").min(1, "The next number is 1 or more").max(999_999_999, "The next number is too large"),
  reportFooter: z.string().trim().max(300, "Keep the line under 300 characters").default(""),
});

function requireLabManager(actor: Actor): string {
  if (actor.scope.kind !== "lab" || actor.role !== "admin") throw new HttpError(403, "Only lab managers change the lab's settings.");
  return actor.scope.labId;
}

export async function getLabSettingsView(actor: Actor) {
  const row = await getLabSettings(requireLabManager(actor));
  return { reportPrefix: row.reportPrefix, nextReportNumber: row.nextReportNumber, reportFooter: row.reportFooter, nextNumber: formatReportNumber(row.reportPrefix, row.nextReportNumber) };
}

/**
 * Saves the numbering. Refused: a prefix another lab uses (numbers are public and must be unique), a
 * next number lower than the current one under the same prefix, or a number already on a released report.
 */
export async function saveLabSettings(actor: Actor, input: z.output<typeof labSettingsSchema>): Promise<void> {
  const labId = requireLabManager(actor);
  const current = await getLabSettings(labId);
  if (await prefixTakenByOtherLab(labId, input.reportPrefix)) throw new InputError({ reportPrefix: "Another lab numbers its reports with this prefix: choose another" });
  if (input.reportPrefix === current.reportPrefix && input.nextReportNumber < current.nextReportNumber) {
    throw new InputError({ nextReportNumber: `Numbers below ${current.nextReportNumber} may already be used: the next number cannot go back` });
  }
  if (await reportNumberUsed(formatReportNumber(input.reportPrefix, input.nextReportNumber))) {
    throw new InputError({ nextReportNumber: "A released report already has this number: choose a higher one" });
  }
  await updateLabSettings(labId, input);
}
