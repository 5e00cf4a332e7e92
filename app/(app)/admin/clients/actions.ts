"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { requireRole } from "@/lib/auth/guards";
import { createClient, setClientActive, updateClient } from "@/lib/dal/clients";
import { refusedForm, type SetupFormState } from "@/lib/dal/setup-access";
import { asForm } from "@/lib/forms/fields";

const idSchema = z.object({ clientId: z.uuid("No such client") });
const toggleSchema = idSchema.extend({ active: z.enum(["true", "false"], { error: "active must be true or false" }) });

/** Creates a client linked to the lab, or (with clientId) edits one. Lab managers only. */
export async function saveClientAction(_prev: SetupFormState, form: FormData): Promise<SetupFormState> {
  form = asForm(form);
  await requireRole("admin");
  const raw = Object.fromEntries(form);
  const { clientId, ...fields } = raw;
  let name: string;
  try {
    if (clientId) {
      const id = idSchema.parse({ clientId }).clientId;
      name = (await updateClient(id, fields)).name;
    } else {
      name = (await createClient(fields)).name;
    }
  } catch (err) {
    if (err instanceof z.ZodError) return { ok: false, message: "No such client of your lab." };
    return refusedForm(err, form);
  }
  revalidatePath("/admin/clients");
  return { ok: true, message: clientId ? `${name} saved.` : `${name} added as a client of your lab.` };
}

/** Deactivates or reactivates a client of the lab. */
export async function setClientActiveAction(form: FormData): Promise<void> {
  form = asForm(form);
  await requireRole("admin");
  const parsed = toggleSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return;
  await setClientActive(parsed.data.clientId, parsed.data.active === "true");
  revalidatePath("/admin/clients");
}
