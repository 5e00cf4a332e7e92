"use server";

import { headers } from "next/headers";
import { revalidatePath } from "next/cache";
import type { z } from "zod";
import { HttpError } from "@/lib/auth/guards";
import { clientAddressFrom } from "@/lib/auth/client-address";
import { requireRoleActor } from "@/lib/dal/actor";
import { asForm } from "@/lib/forms/fields";
import { releaseInputSchema, releaseReport, supersedeInputSchema, supersedeReport, withdrawInputSchema, withdrawReport } from "@/lib/dal/releases";

export type ReleaseState = { ok: boolean; message: string; fields?: Record<string, string> };

type Kind = "release" | "supersede" | "withdraw";
const SCHEMAS = { release: releaseInputSchema, supersede: supersedeInputSchema, withdraw: withdrawInputSchema } as const;
const DONE: Record<Kind, (n: string, r: number) => string> = {
  release: (n) => `Report ${n} released (revision 1).`,
  supersede: (n, r) => `Revision ${r} of report ${n} released; the earlier revision is superseded.`,
  withdraw: (n, r) => `Revision ${r} of report ${n} withdrawn.`,
};

function fieldErrors(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) out[String(issue.path[0] ?? "form")] ??= issue.message;
  return out;
}

async function run(kind: Kind, form: unknown): Promise<ReleaseState> {
  // Quality engineers and lab managers sign releases; anyone else is refused before the form is read.
  const actor = await requireRoleActor("qa", "admin");
  const parsed = SCHEMAS[kind].safeParse(Object.fromEntries(asForm(form)));
  if (!parsed.success) return { ok: false, message: "Check the fields marked below.", fields: fieldErrors(parsed.error) };
  const address = clientAddressFrom(await headers());
  let done: string;
  try {
    const input = parsed.data as z.output<typeof supersedeInputSchema>;
    const row = kind === "release" ? await releaseReport(actor, input, address)
      : kind === "supersede" ? await supersedeReport(actor, input, address)
      : await withdrawReport(actor, input, address);
    done = DONE[kind](row.number, row.revision);
  } catch (err) {
    if (err instanceof HttpError) return { ok: false, message: err.message };
    throw err;
  }
  revalidatePath(`/units/${parsed.data.unitId}`);
  return { ok: true, message: done };
}

export async function releaseAction(_prev: ReleaseState, form: FormData): Promise<ReleaseState> {
  return run("release", form);
}

export async function supersedeAction(_prev: ReleaseState, form: FormData): Promise<ReleaseState> {
  return run("supersede", form);
}

export async function withdrawAction(_prev: ReleaseState, form: FormData): Promise<ReleaseState> {
  return run("withdraw", form);
}
