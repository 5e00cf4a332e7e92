"use server";

import { redirect } from "next/navigation";
import { z } from "zod";
import { setPasswordWithLink } from "@/lib/dal/password-link";
import { asForm } from "@/lib/forms/fields";

const setPasswordSchema = z
  .object({
    token: z.string().min(20).max(100),
    password: z.string().min(10, "Use at least 10 characters.").max(200),
    confirm: z.string(),
  })
  .refine((v) => v.password === v.confirm, { message: "The two passwords differ.", path: ["confirm"] });

export async function setPassword(_prev: string, form: FormData): Promise<string> {
  form = asForm(form);
  const parsed = setPasswordSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return parsed.error.issues[0]?.message ?? "Check the form.";
  const done = await setPasswordWithLink(parsed.data.token, parsed.data.password);
  if (!done) return "This link has expired or was already used. Ask for a new one.";
  redirect("/sign-in?password=set");
}
