"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { requireRole } from "@/lib/auth/guards";
import { requireRoleActor } from "@/lib/dal/actor";
import { changePlanStep } from "@/lib/dal/rating-plans";
import { rejudgeRating, saveProfileVersion } from "@/lib/dal/rating-profiles";
import { createRating, setRatingRetired, updateRating } from "@/lib/dal/ratings";
import { refusedForm, type SetupFormState } from "@/lib/dal/setup-access";
import { unflattenForm } from "@/lib/ratings/form-data";
import { asForm } from "@/lib/forms/fields";

// Every action: guard (lab manager or quality engineer), then the DAL (which checks again and scopes to
// the lab), then revalidate or redirect outside any try.

const editor = () => requireRoleActor("admin", "qa");
const ratingIdSchema = z.object({ ratingId: z.uuid("No such rating") });
const stepRefSchema = ratingIdSchema.extend({ stepId: z.uuid("No such step") });
const ids = (form: FormData) => ratingIdSchema.safeParse(Object.fromEntries(form));
const notFound: SetupFormState = { ok: false, message: "No such rating in your lab." };

export async function createRatingAction(_prev: SetupFormState, form: FormData): Promise<SetupFormState> {
  form = asForm(form);
  const actor = await editor();
  let id: string;
  try {
    id = (await createRating(actor, unflattenForm(form.entries()))).id;
  } catch (err) {
    return refusedForm(err, form);
  }
  revalidatePath("/ratings");
  redirect(`/ratings/${id}?saved=created`);
}

export async function updateRatingAction(_prev: SetupFormState, form: FormData): Promise<SetupFormState> {
  form = asForm(form);
  const actor = await editor();
  const parsed = ids(form);
  if (!parsed.success) return notFound;
  const { modelCode, title, nameplate } = unflattenForm(form.entries());
  try {
    await updateRating(actor, parsed.data.ratingId, { modelCode, title, nameplate });
  } catch (err) {
    return refusedForm(err, form);
  }
  revalidatePath(`/ratings/${parsed.data.ratingId}`);
  redirect(`/ratings/${parsed.data.ratingId}?saved=nameplate`);
}

export async function setRatingRetiredAction(form: FormData): Promise<void> {
  form = asForm(form);
  const actor = await editor();
  const parsed = ratingIdSchema.extend({ retired: z.enum(["true", "false"]) }).safeParse(Object.fromEntries(form));
  if (!parsed.success) return;
  await setRatingRetired(actor, parsed.data.ratingId, parsed.data.retired === "true");
  revalidatePath(`/ratings/${parsed.data.ratingId}`);
  revalidatePath("/ratings");
}

export async function saveProfileAction(_prev: SetupFormState, form: FormData): Promise<SetupFormState> {
  form = asForm(form);
  const actor = await editor();
  const parsed = ids(form);
  if (!parsed.success) return notFound;
  const { profile, reason } = unflattenForm(form.entries());
  let version: number;
  try {
    version = (await saveProfileVersion(actor, parsed.data.ratingId, { profile, reason })).version;
  } catch (err) {
    return refusedForm(err, form);
  }
  revalidatePath(`/ratings/${parsed.data.ratingId}`);
  redirect(`/ratings/${parsed.data.ratingId}?saved=profile&version=${version}`);
}

/** The step as the API takes it: only the speed fields of the chosen way of giving the window. */
function stepFromForm(form: FormData) {
  const { ratingId: _r, stepId: _s, speedMode, speedMinRpm, speedMaxRpm, speedRpm, speedTolerancePercent, ...rest } = unflattenForm(form.entries());
  void _r; void _s;
  return speedMode === "range" ? { ...rest, speedMinRpm, speedMaxRpm } : { ...rest, speedRpm, speedTolerancePercent };
}

export async function savePlanStepAction(_prev: SetupFormState, form: FormData): Promise<SetupFormState> {
  form = asForm(form);
  const actor = await editor();
  const parsed = ratingIdSchema.extend({ stepId: z.uuid().optional() }).safeParse({ ...Object.fromEntries(form), stepId: form.get("stepId") || undefined });
  if (!parsed.success) return notFound;
  const { ratingId, stepId } = parsed.data;
  try {
    await changePlanStep(actor, ratingId, stepId ? { kind: "edit", stepId, step: stepFromForm(form) } : { kind: "add", step: stepFromForm(form) });
  } catch (err) {
    return refusedForm(err, form);
  }
  revalidatePath(`/ratings/${ratingId}`);
  redirect(`/ratings/${ratingId}?saved=plan`);
}

export async function movePlanStepAction(form: FormData): Promise<void> {
  form = asForm(form);
  const actor = await editor();
  const parsed = stepRefSchema.extend({ by: z.enum(["-1", "1"]) }).safeParse(Object.fromEntries(form));
  if (!parsed.success) return;
  await changePlanStep(actor, parsed.data.ratingId, { kind: "move", stepId: parsed.data.stepId, by: parsed.data.by === "1" ? 1 : -1 });
  revalidatePath(`/ratings/${parsed.data.ratingId}`);
  redirect(`/ratings/${parsed.data.ratingId}?saved=plan`);
}

export async function retirePlanStepAction(form: FormData): Promise<void> {
  form = asForm(form);
  const actor = await editor();
  const parsed = stepRefSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return;
  await changePlanStep(actor, parsed.data.ratingId, { kind: "retire", stepId: parsed.data.stepId });
  revalidatePath(`/ratings/${parsed.data.ratingId}`);
  redirect(`/ratings/${parsed.data.ratingId}?saved=plan`);
}

/** Judges the rating's analysed captures again against the profile in force and their plan steps. */
export async function rejudgeRatingAction(form: FormData): Promise<void> {
  form = asForm(form);
  const actor = await editor();
  const parsed = ids(form);
  if (!parsed.success) return;
  const result = await rejudgeRating(actor, parsed.data.ratingId);
  revalidatePath(`/ratings/${parsed.data.ratingId}`);
  redirect(`/ratings/${parsed.data.ratingId}?rejudged=${result.rejudged}&unchanged=${result.unchanged}`);
}
