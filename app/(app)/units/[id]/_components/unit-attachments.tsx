import { AttachmentList } from "@/components/attachments/attachment-list";
import { AttachmentUploader } from "@/components/attachments/attachment-uploader";
import { getUnitAttachmentsView } from "@/lib/dal/attachments";
import { RemoveAttachmentButton } from "./remove-attachment-button";

/** The unit's attachments: upload for lab staff, the list for everyone who may see the unit, removal for QA and managers. */
export async function UnitAttachments({ unitId }: { unitId: string }) {
  const view = await getUnitAttachmentsView(unitId);
  return (
    <section aria-labelledby="attachments" className="mt-6 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200">
      <h2 id="attachments" className="mb-3 font-semibold">Attachments</h2>
      {view.canUpload ? <AttachmentUploader unitId={unitId} /> : null}
      <AttachmentList
        rows={view.rows}
        actions={view.canRemove ? (row) => <RemoveAttachmentButton attachmentId={row.id} unitId={unitId} name={row.originalName} /> : undefined}
      />
    </section>
  );
}
