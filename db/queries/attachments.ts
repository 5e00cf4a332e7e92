import { and, desc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { attachments, unitEvents, units, users, type Attachment, type AttachmentKind } from "@/db/schema";
import { unitScopeWhere, type Scope } from "./scope";

export type NewAttachment = {
  unitId: string; kind: AttachmentKind; caption: string; originalName: string; contentType: string;
  sizeBytes: number; fileKey: string; fileHash: string; uploadedById: string;
};

/**
 * Records a stored file. The upload callback can be delivered more than once for the same file key;
 * the second time returns the row already there.
 */
export async function insertAttachmentOnce(values: NewAttachment): Promise<Attachment> {
  const db = getDb();
  const [inserted] = await db.insert(attachments).values(values).onConflictDoNothing({ target: attachments.fileKey }).returning();
  if (inserted) return inserted;
  const [existing] = await db.select().from(attachments).where(eq(attachments.fileKey, values.fileKey)).limit(1);
  if (!existing) throw new Error("attachment insert conflicted but no row was found");
  return existing;
}

const listColumns = {
  id: attachments.id, unitId: attachments.unitId, kind: attachments.kind, caption: attachments.caption,
  originalName: attachments.originalName, contentType: attachments.contentType, sizeBytes: attachments.sizeBytes,
  fileHash: attachments.fileHash, createdAt: attachments.createdAt, uploadedBy: users.name,
};

export async function listUnitAttachments(scope: Scope, unitId: string) {
  return getDb()
    .select(listColumns)
    .from(attachments)
    .innerJoin(units, eq(units.id, attachments.unitId))
    .innerJoin(users, eq(users.id, attachments.uploadedById))
    .where(and(unitScopeWhere(scope), eq(attachments.unitId, unitId)))
    .orderBy(desc(attachments.createdAt), desc(attachments.id));
}

/** One attachment with its file key, or undefined when it is missing or outside the scope. */
export async function getAttachment(scope: Scope, attachmentId: string) {
  const [row] = await getDb()
    .select({ attachment: attachments })
    .from(attachments)
    .innerJoin(units, eq(units.id, attachments.unitId))
    .where(and(unitScopeWhere(scope), eq(attachments.id, attachmentId)))
    .limit(1);
  return row?.attachment;
}

/**
 * Removes the row and writes the audit event in one transaction; returns the removed row (its file
 * key is for deleting the stored bytes) or null when it is missing or outside the scope.
 */
export async function deleteAttachmentRecord(scope: Scope, attachmentId: string, actorId: string): Promise<Attachment | null> {
  return getDb().transaction(async (tx) => {
    const [row] = await tx.select({ attachment: attachments }).from(attachments)
      .innerJoin(units, eq(units.id, attachments.unitId))
      .where(and(unitScopeWhere(scope), eq(attachments.id, attachmentId)))
      .for("update", { of: attachments });
    if (!row) return null;
    const a = row.attachment;
    await tx.delete(attachments).where(eq(attachments.id, a.id));
    await tx.insert(unitEvents).values({
      unitId: a.unitId, actorId, kind: "attachment-removed",
      comment: `Removed attachment “${a.originalName}” (${a.kind}, ${a.sizeBytes} bytes)${a.caption ? `: ${a.caption}` : ""}`,
    });
    return a;
  });
}
