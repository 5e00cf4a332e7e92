"use server";

import { z } from "zod";
import { countRecentTokens } from "@/db/queries/password-tokens";
import { findUserIdByEmail } from "@/db/queries/users";
import { sendPasswordLink } from "@/lib/auth/password-links";

const forgotSchema = z.object({ email: z.email().max(254) });
const SAME_ANSWER = "If that address has an account, a reset link is on its way. It works once, for one hour.";

export async function requestPasswordReset(_prev: string, form: FormData): Promise<string> {
  const parsed = forgotSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return "Enter a valid email address.";
  const user = await findUserIdByEmail(parsed.data.email);
  // The answer never reveals whether the account exists; at most three links an hour per account.
  if (user && (await countRecentTokens(user.id, "reset", 3600)) < 3) {
    await sendPasswordLink({ id: user.id, email: parsed.data.email, name: user.name }, "reset");
  }
  return SAME_ANSWER;
}
