import { deleteAbandonedUploads } from "@/db/queries/captures";
import { abortMultipartUpload, deleteIncompleteObject } from "@/lib/server/storage";

// An upload that was registered but never completed (the browser tab closed, the bench PC lost
// power) leaves a row in `uploading` and perhaps some parts in storage. Once its last upload URL
// is older than UPLOAD_ABANDON_HOURS the row goes first, atomically, so nobody can take it for a
// capture; then its parts and any object are removed. Re-sending the file registers it afresh.

export type UploadSweepResult = { removed: number; partsLeft: number; storageErrors: string[] };

export async function sweepAbandonedUploads(olderThanMs: number, now = Date.now()): Promise<UploadSweepResult> {
  const result: UploadSweepResult = { removed: 0, partsLeft: 0, storageErrors: [] };
  const before = new Date(now - olderThanMs);
  for (;;) {
    const rows = await deleteAbandonedUploads(before);
    result.removed += rows.length;
    for (const row of rows) {
      try {
        if (row.multipartUploadId && !(await abortMultipartUpload(row.objectKey, row.multipartUploadId))) result.partsLeft++;
        await deleteIncompleteObject(row.objectKey);
      } catch (err) {
        // The row is gone already; what is left in storage is unreferenced and never analysed.
        result.storageErrors.push(`${row.objectKey}: ${err instanceof Error ? err.message : String(err)}`);
      }
    }
    if (rows.length === 0) return result;
  }
}
