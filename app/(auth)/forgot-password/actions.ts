"use server";

import { z } from "zod";
import { headers } from "next/headers";
import { clientAddressFrom } from "@/lib/auth/client-address";
import { acceptPasswordResetRequest } from "@/lib/dal/password-link";
import { asForm } from "@/lib/forms/fields";

const forgotSchema = z.object({ email: z.email().max(254) });
const SAME_ANSWER = "If that address has an account, a reset link is on its way. It works once, for one hour.";

export async function requestPasswordReset(_prev: string, form: FormData): Promise<string> {
  form = asForm(form);
  const parsed = forgotSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return "Enter a valid email address.";
  // The answer never reveals whether the account exists, in its words or its timing.
  if (!(await acceptPasswordResetRequest(parsed.data.email, clientAddressFrom(await headers())))) {
    return "Too many reset requests from your address. Try again in an hour.";
  }
  return SAME_ANSWER;
}
