"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { requireRole } from "@/lib/auth/guards";
import { createClientToken, newClientTokenSchema, revokeMyOrganisationToken } from "@/lib/dal/client-tokens";
import { asForm } from "@/lib/forms/fields";

export type TokenState = { ok: boolean; message: string; token?: string; fieldErrors?: Partial<Record<"label" | "days", string>> };

export async function createTokenAction(_prev: TokenState, form: FormData): Promise<TokenState> {
  await requireRole("manufacturer");
  form = asForm(form);
  const parsed = newClientTokenSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) {
    const fieldErrors: TokenState["fieldErrors"] = {};
    for (const i of parsed.error.issues) fieldErrors[i.path[0] as "label" | "days"] ??= i.message;
    return { ok: false, message: "Check the highlighted fields.", fieldErrors };
  }
  const made = await createClientToken(parsed.data);
  revalidatePath("/portal/tokens");
  return { ok: true, token: made.token, message: `Copy the token now: it is shown only once. It expires on ${made.expiresAt.toISOString().slice(0, 10)}.` };
}

const revokeSchema = z.object({ tokenId: z.uuid("tokenId: not a token id.") });

export async function revokeTokenAction(form: FormData): Promise<void> {
  await requireRole("manufacturer");
  form = asForm(form);
  const parsed = revokeSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return;
  await revokeMyOrganisationToken(parsed.data.tokenId);
  revalidatePath("/portal/tokens");
}
