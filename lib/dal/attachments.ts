import "server-only";
import { z } from "zod";
import { deleteAttachmentRecord, getAttachment, listUnitAttachments } from "@/db/queries/attachments";
import type { Role } from "@/db/schema";
import { HttpError, requireUser } from "@/lib/auth/guards";
import type { SessionUser } from "@/lib/auth/options";
import { isLabRole } from "@/lib/auth/roles";
import { deleteStoredFiles } from "@/lib/server/uploadthing";
import { unitInScope } from "./request-reads";
import { scopeFor } from "./scope";

// Who may do what with a unit's attachments. Lab staff of the testing lab upload and read; lab
// managers and quality engineers remove; a client reads its own units' files. Another
// organisation's unit or file answers like a missing one.

export const canUploadAttachments = (role: Role) => isLabRole(role);
export const canRemoveAttachments = (role: Role) => role === "admin" || role === "qa";

const isUuid = (id: string) => z.uuid().safeParse(id).success;

export async function listAttachmentsFor(user: SessionUser, unitId: string) {
  if (!isUuid(unitId)) return [];
  const scope = scopeFor(user);
  const rows = await listUnitAttachments(scope, unitId);
  // Staff names stay inside the lab: a client reads who uploaded as the lab.
  return scope.kind === "lab" ? rows : rows.map((r) => ({ ...r, uploadedBy: "the lab" }));
}

/** For the unit page. */
export async function getUnitAttachmentsView(unitId: string) {
  const user = await requireUser();
  const rows = await listAttachmentsFor(user, unitId);
  return { rows, canUpload: canUploadAttachments(user.role), canRemove: canRemoveAttachments(user.role) };
}

/** For the upload route's middleware: the unit, if this user may attach files to it. */
export async function authorizeAttachmentUpload(user: SessionUser, unitId: string) {
  if (!canUploadAttachments(user.role)) throw new HttpError(403, "Only lab staff may attach files to a unit.");
  const found = isUuid(unitId) ? await unitInScope(scopeFor(user), unitId) : undefined;
  if (!found) throw new HttpError(404, "No such unit.");
  return found.unit;
}

/** For the download handler: the attachment row, or null for a missing or out-of-scope one. */
export async function findAttachmentFor(user: SessionUser, attachmentId: string) {
  if (!isUuid(attachmentId)) return null;
  return (await getAttachment(scopeFor(user), attachmentId)) ?? null;
}

/**
 * Removes an attachment: the row and its audit event first (the record is what users see), then the
 * stored bytes. A failure of the second step leaves an unreferenced file, logged, not a broken row.
 */
export async function removeAttachmentAs(user: SessionUser, attachmentId: string) {
  if (!canRemoveAttachments(user.role)) throw new HttpError(403, "Only lab managers and quality engineers may remove attachments.");
  if (!isUuid(attachmentId)) return null;
  const removed = await deleteAttachmentRecord(scopeFor(user), attachmentId, user.id);
  if (!removed) return null;
  try {
    await deleteStoredFiles([removed.fileKey]);
  } catch (err) {
    console.error(`attachment ${removed.id}: row removed, but deleting stored file ${removed.fileKey} failed:`, err);
  }
  return removed;
}
