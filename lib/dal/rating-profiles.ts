import "server-only";
import { insertProfileVersion, listProfileVersions } from "@/db/queries/profiles";
import { listPlanStepsForLab } from "@/db/queries/plan-steps";
import { countJudgedCapturesOfRating } from "@/db/queries/ratings";
import { CHECK_IDS, CHECK_LABELS, describeSource, toleranceProfileSchema, type ToleranceProfile } from "@/lib/analysis";
import { HttpError } from "@/lib/auth/guards";
import { describeBand } from "@/lib/ratings/labels";
import { diffProfiles } from "@/lib/ratings/profile-diff";
import { profileVersionSchema } from "@/lib/ratings/input-schemas";
import type { Actor } from "./actor";
import { requestRejudge } from "./rejudge";
import { InputError, parseFields, requireSetupEditor } from "./setup-access";
import { requireLabRating } from "./ratings";

// Versions of a rating's tolerance profile: each save is a new immutable version (who, when, why).

/** One row per check as a quality engineer reads it. */
export function profileRows(profile: ToleranceProfile) {
  return CHECK_IDS.map((id) => {
    const rule = profile.checks[id];
    return {
      id, label: CHECK_LABELS[id], required: rule.required,
      band: rule.required ? describeBand(id, rule) : "Not required",
      source: rule.required ? describeSource(rule.source) : null,
      reason: rule.required ? null : rule.reason,
    };
  });
}

export async function getProfileHistory(actor: Actor, ratingId: string) {
  const { scope } = await requireLabRating(actor, ratingId);
  const rows = await listProfileVersions(scope, ratingId);
  const parsed = rows.map((r) => ({ row: r, profile: toleranceProfileSchema.safeParse(r.version.profile) }));
  return parsed.map(({ row, profile }, i) => {
    const older = parsed[i + 1];
    return {
      id: row.version.id, version: row.version.version, reason: row.version.reason, createdAt: row.version.createdAt, author: row.author ?? "Seed or station",
      profile: profile.success ? profile.data : null,
      rows: profile.success ? profileRows(profile.data) : [],
      changes: !profile.success ? ["This version could not be read"] : older?.profile.success ? diffProfiles(older.profile.data, profile.data) : ["First version"],
    };
  });
}

/** Saves a new version; a check a plan step uses must stay judged. */
export async function saveProfileVersion(actor: Actor, ratingId: string, raw: unknown) {
  const editor = requireSetupEditor(actor);
  await requireLabRating(actor, ratingId);
  const input = parseFields(profileVersionSchema, raw);
  const steps = await listPlanStepsForLab(editor, ratingId);
  const fields: Record<string, string> = {};
  for (const step of steps) {
    for (const check of step.checks) {
      if (!input.profile.checks[check].required) fields[`profile.checks.${check}.required`] ??= `The plan step "${step.name}" judges ${CHECK_LABELS[check]}: take it out of the step first`;
    }
  }
  if (Object.keys(fields).length > 0) throw new InputError(fields);
  const saved = await insertProfileVersion(editor, ratingId, { profile: input.profile, reason: input.reason, userId: actor.userId });
  if (!saved) throw new HttpError(404, "No such rating in your lab");
  return { id: saved.id, version: saved.version, reason: saved.reason, createdAt: saved.createdAt, profile: saved.profile, affectedCaptures: await countJudgedCapturesOfRating(editor, ratingId) };
}

/** Judges the rating's analysed captures again against the profile in force; earlier results stay in history. */
export async function rejudgeRating(actor: Actor, ratingId: string) {
  requireSetupEditor(actor);
  await requireLabRating(actor, ratingId);
  return requestRejudge(actor, { ratingId });
}

export async function countAffectedCaptures(actor: Actor, ratingId: string) {
  const { scope } = await requireLabRating(actor, ratingId);
  return countJudgedCapturesOfRating(scope, ratingId);
}
