import "server-only";
import { createAttachmentRouter, type AttachmentRouter } from "@/lib/attachments/file-router";
import { getSessionUser } from "@/lib/auth/guards";

// The file router of this app: uploads are authorised against the session of the request.
export const uploadRouter: AttachmentRouter = createAttachmentRouter({ currentUser: getSessionUser });

export type UploadRouter = AttachmentRouter;
