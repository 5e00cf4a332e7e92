import { HttpError } from "@/lib/auth/guards";
import { requireSessionActor } from "@/lib/dal/actor";
import { findCertificateFor } from "@/lib/dal/instrument-certificates";
import { apiRoute } from "@/lib/dal/route-handler";
import { fetchStoredFile } from "@/lib/server/uploadthing";

export const dynamic = "force-dynamic";

/** The bytes of a calibration certificate, after the session and the register's access are checked. */
export const GET = apiRoute(async (_request: Request, { params }: { params: Promise<{ id: string; certificateId: string }> }) => {
  const { id, certificateId } = await params;
  const certificate = await findCertificateFor(await requireSessionActor(), id, certificateId);
  const stored = await fetchStoredFile(certificate.fileKey);
  if (!stored) throw new HttpError(404, "The stored file of this certificate is missing.");
  const ascii = certificate.originalName.replace(/[^\x20-\x7e]|["\\]/g, "_");
  return new Response(stored.body, {
    headers: {
      "content-type": "application/pdf",
      "content-length": String(certificate.sizeBytes),
      "content-disposition": `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(certificate.originalName)}`,
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
      "content-security-policy": "sandbox; default-src 'none'; frame-ancestors 'none'",
    },
  });
});
