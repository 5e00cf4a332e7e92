"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { HttpError } from "@/lib/auth/guards";
import { requireRoleActor } from "@/lib/dal/actor";
import { createStation, createStationKey, revokeKey } from "@/lib/dal/stations";
import { asForm } from "@/lib/forms/fields";

const newKeySchema = z.object({ stationId: z.uuid("Pick a bench."), label: z.string().trim().min(2, "Name the key (which PC uses it).").max(80) });
const revokeSchema = z.object({ keyId: z.uuid() });
const newStationSchema = z.object({ name: z.string().trim().min(2, "Name the bench.").max(120), location: z.string().trim().max(120).default("") });

export type KeyState = { ok: boolean; message: string; token?: string };

export async function createKeyAction(_prev: KeyState, form: FormData): Promise<KeyState> {
  form = asForm(form);
  await requireRoleActor("admin");
  const parsed = newKeySchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return { ok: false, message: parsed.error.issues[0]?.message ?? "Check the form." };
  let created;
  try {
    created = await createStationKey(parsed.data);
  } catch (err) {
    return { ok: false, message: err instanceof HttpError ? err.message : "The key was not created." };
  }
  revalidatePath("/stations");
  return { ok: true, message: `Key for ${created.stationName} created. Copy it now: it is shown only once.`, token: created.token };
}

export async function revokeKeyAction(form: FormData): Promise<void> {
  form = asForm(form);
  await requireRoleActor("admin");
  const parsed = revokeSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return;
  await revokeKey(parsed.data.keyId);
  revalidatePath("/stations");
}

export type StationState = { ok: boolean; message: string };

export async function createStationAction(_prev: StationState, form: FormData): Promise<StationState> {
  form = asForm(form);
  await requireRoleActor("admin");
  const parsed = newStationSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return { ok: false, message: parsed.error.issues[0]?.message ?? "Check the form." };
  try {
    await createStation(parsed.data);
  } catch (err) {
    return { ok: false, message: err instanceof HttpError ? err.message : "The bench was not added." };
  }
  revalidatePath("/stations");
  return { ok: true, message: `${parsed.data.name} added.` };
}
