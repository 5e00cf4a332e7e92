"use server";

import { revalidatePath } from "next/cache";
import { requireRole } from "@/lib/auth/guards";
import { deleteAttachmentSchema } from "@/lib/attachments/rules";
import { removeAttachmentAs } from "@/lib/dal/attachments";
import { asForm } from "@/lib/forms/fields";

export type RemoveAttachmentState = { ok: boolean; message: string };

export async function removeAttachment(_prev: RemoveAttachmentState, form: FormData): Promise<RemoveAttachmentState> {
  form = asForm(form);
  const user = await requireRole("qa", "admin");
  const parsed = deleteAttachmentSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return { ok: false, message: "That is not an attachment." };
  const removed = await removeAttachmentAs(user, parsed.data.attachmentId);
  // Already gone or another organisation's: the same answer.
  if (!removed) return { ok: false, message: "That attachment no longer exists." };
  revalidatePath(`/units/${removed.unitId}`);
  return { ok: true, message: `Removed “${removed.originalName}”.` };
}
