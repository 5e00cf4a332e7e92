"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { requireUser } from "@/lib/auth/guards";
import { endMyOtherSessions, signOutEverywhere } from "@/lib/dal/sessions";

export async function endOtherSessionsAction(): Promise<void> {
  await requireUser();
  const ended = await endMyOtherSessions();
  revalidatePath("/account");
  redirect(`/account?ended=${ended}`);
}

export async function signOutEverywhereAction(): Promise<void> {
  await requireUser();
  await signOutEverywhere();
  redirect("/sign-in");
}
