import "server-only";
import { createUploadthing, type FileRouter } from "uploadthing/next";
import { UploadThingError } from "uploadthing/server";
import { insertAttachmentOnce } from "@/db/queries/attachments";
import { HttpError } from "@/lib/auth/guards";
import type { SessionUser } from "@/lib/auth/options";
import { authorizeAttachmentUpload } from "@/lib/dal/attachments";
import { authorizeCertificateUpload, certificateUploadInputSchema, recordCertificate } from "@/lib/dal/instrument-certificates";
import {
  ATTACHMENT_MAX_FILES, ATTACHMENT_MAX_SIZE, attachmentUploadInputSchema, checkAttachmentFiles,
} from "./rules";

// The uploadthing file router for unit attachments. Built by a function so tests can hand in the
// signed-in user; app/api/uploadthing/core.ts builds it with the session.

// The SDK's reasons (e.g. a size over the limit) travel in `cause`; the form shows them as they are.
const f = createUploadthing({
  errorFormatter: (err) => ({ message: typeof err.cause === "string" ? err.cause : err.message }),
});

// Files are private: only a URL signed with the app's key reads them, and only the app makes those.
const perType = { maxFileSize: ATTACHMENT_MAX_SIZE, maxFileCount: ATTACHMENT_MAX_FILES, acl: "private", contentDisposition: "attachment" } as const;

function asUploadError(err: unknown): unknown {
  if (!(err instanceof HttpError)) return err;
  return new UploadThingError({ code: err.status === 404 ? "NOT_FOUND" : err.status === 400 ? "BAD_REQUEST" : "FORBIDDEN", message: err.message });
}

export function createAttachmentRouter(deps: { currentUser: () => Promise<SessionUser | null> }) {
  return {
    unitAttachment: f(
      { "image/png": perType, "image/jpeg": perType, "image/webp": perType, "application/pdf": perType },
      { awaitServerData: true },
    )
      .input(attachmentUploadInputSchema)
      .middleware(async ({ input, files }) => {
        const user = await deps.currentUser();
        if (!user) throw new UploadThingError({ code: "FORBIDDEN", message: "Sign in first." });
        const unit = await authorizeAttachmentUpload(user, input.unitId).catch((err: unknown) => {
          throw asUploadError(err);
        });
        // The per-type counts of the route config do not bound the total; this does, and names each file.
        const problems = checkAttachmentFiles(files);
        if (problems.length > 0) throw new UploadThingError({ code: "BAD_REQUEST", message: problems.join(" ") });
        return { unitId: unit.id, kind: input.kind, caption: input.caption, uploadedById: user.id };
      })
      .onUploadComplete(async ({ metadata, file }) => {
        try {
          const row = await insertAttachmentOnce({
            unitId: metadata.unitId, kind: metadata.kind, caption: metadata.caption, originalName: file.name,
            contentType: file.type, sizeBytes: file.size, fileKey: file.key, fileHash: file.fileHash, uploadedById: metadata.uploadedById,
          });
          return { attachmentId: row.id };
        } catch (err) {
          // The SDK swallows this at debug level; the stored file then has no row.
          console.error(`attachment upload: recording stored file ${file.key} for unit ${metadata.unitId} failed:`, err);
          throw err;
        }
      }),
    /** A calibration certificate (PDF) of an instrument in the register; lab managers only. */
    instrumentCertificate: f({ "application/pdf": { ...perType, maxFileCount: 1 } }, { awaitServerData: true })
      .input(certificateUploadInputSchema)
      .middleware(async ({ input }) => {
        const user = await deps.currentUser();
        if (!user) throw new UploadThingError({ code: "FORBIDDEN", message: "Sign in first." });
        const instrument = await authorizeCertificateUpload(user, input.instrumentId).catch((err: unknown) => {
          throw asUploadError(err);
        });
        return { instrumentId: instrument.id, uploadedById: user.id };
      })
      .onUploadComplete(async ({ metadata, file }) => {
        const id = await recordCertificate({ ...metadata, originalName: file.name, contentType: file.type, sizeBytes: file.size, fileKey: file.key, fileHash: file.fileHash });
        return { certificateId: id };
      }),
  } satisfies FileRouter;
}

export type AttachmentRouter = ReturnType<typeof createAttachmentRouter>;
