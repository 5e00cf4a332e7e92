import { HttpError, requireApiUser } from "@/lib/auth/guards";
import { findAttachmentFor } from "@/lib/dal/attachments";
import { downloadNameFor, isImageType } from "@/lib/attachments/rules";
import { fetchStoredFile } from "@/lib/server/uploadthing";
import { apiRoute } from "@/lib/dal/route-handler";

export const dynamic = "force-dynamic";

/** `filename*` per RFC 6266 / RFC 5987, with an ASCII fallback for old clients. */
function disposition(kind: "inline" | "attachment", name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]|["\\]/g, "_");
  return `${kind}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}

/**
 * The bytes of one attachment, after the session and the unit's scope are checked; the store's
 * signed URL stays on the server. `?disposition=inline` shows an image in place (thumbnails);
 * everything else downloads.
 */
export const GET = apiRoute(async (request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const user = await requireApiUser();
  const attachment = await findAttachmentFor(user, (await params).id);
  if (!attachment) throw new HttpError(404, "No such attachment.");
  const stored = await fetchStoredFile(attachment.fileKey);
  if (!stored) throw new HttpError(404, "The stored file of this attachment is missing.");
  const inline = new URL(request.url).searchParams.get("disposition") === "inline" && isImageType(attachment.contentType);
  return new Response(stored.body, {
    headers: {
      "content-type": attachment.contentType,
      "content-length": String(attachment.sizeBytes),
      "content-disposition": disposition(inline ? "inline" : "attachment", downloadNameFor(attachment.originalName, attachment.contentType)),
      etag: `"${attachment.fileHash}"`,
      // Not kept: a removed attachment, or one a user may no longer read, must not come back from a cache.
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
      // A file is never a page: no scripts, forms or plugins even if a browser is talked into rendering it.
      "content-security-policy": "sandbox; default-src 'none'; img-src 'self'; frame-ancestors 'none'",
    },
  });
});
