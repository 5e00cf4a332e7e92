import "server-only";
import { z } from "zod";
import { getInstrument, getInstrumentCertificate, insertInstrumentCertificate } from "@/db/queries/instruments";
import { HttpError } from "@/lib/auth/guards";
import type { SessionUser } from "@/lib/auth/options";
import type { Actor } from "./actor";
import { requireRegisterReader } from "./instruments";
import { scopeFor } from "./scope";

// Calibration certificates go through the attachment upload path (uploadthing); rows in
// instrument_certificates point at the stored file. Lab managers upload; the register's readers download.

export const certificateUploadInputSchema = z.object({ instrumentId: z.uuid("No such instrument") });

export async function authorizeCertificateUpload(user: SessionUser, instrumentId: string) {
  const scope = scopeFor(user);
  if (scope.kind !== "lab" || user.role !== "admin") throw new HttpError(403, "Only lab managers file calibration certificates.");
  const instrument = await getInstrument(scope.labId, instrumentId);
  if (!instrument) throw new HttpError(404, "No such instrument.");
  if (instrument.retiredAt) throw new HttpError(400, "This instrument is retired: its record is kept as it was.");
  return instrument;
}

export async function recordCertificate(values: { instrumentId: string; uploadedById: string; originalName: string; contentType: string; sizeBytes: number; fileKey: string; fileHash: string }): Promise<string> {
  try {
    return await insertInstrumentCertificate(values);
  } catch (err) {
    // The SDK swallows this at debug level; the stored file then has no row.
    console.error(`certificate upload: recording stored file ${values.fileKey} for instrument ${values.instrumentId} failed:`, err);
    throw err;
  }
}

/** For the download handler: the certificate row, 404 for a missing or another lab's. */
export async function findCertificateFor(actor: Actor, instrumentId: string, certificateId: string) {
  const scope = requireRegisterReader(actor);
  const ok = z.uuid().safeParse(instrumentId).success && z.uuid().safeParse(certificateId).success;
  const row = ok ? await getInstrumentCertificate(scope.labId, instrumentId, certificateId) : undefined;
  if (!row) throw new HttpError(404, "No such certificate.");
  return row;
}
