import "server-only";
import { countRecentFailures, clearFailures, recordFailure } from "@/db/queries/sign-in-attempts";
import { findSigner, insertSignature } from "@/db/queries/signatures";
import type { Signature } from "@/db/schema";
import { HttpError } from "@/lib/auth/guards";
import { verifyPassword } from "@/lib/auth/password";
import { signInDelayMs } from "@/lib/auth/sign-in-delay";
import { ROLE_TITLES, SIGNATURE_MEANINGS, SIGNING_ROLES, type SigningPurpose } from "@/lib/reports/signature-meanings";
import { getEnv } from "@/lib/server/env";
import type { Actor } from "./actor";

export type SignRequest = {
  password: string;
  purpose: SigningPurpose;
  subjectKind: "unit" | "report" | "capture";
  subjectId: string;
  /** The client address (clientAddressFrom(headers)), for the same per-address limit as sign-in. */
  address: string;
};

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * A signature: the signed-in person re-enters their password. Only the roles in SIGNING_ROLES may sign
 * for a purpose (403); a wrong password is refused (403) and counted as a failed sign-in of the account,
 * so repeated guesses slow down exactly as at the sign-in page. The caller checks the subject's scope
 * first and stores the returned signature's id with its decision.
 */
export async function signWithPassword(actor: Actor, request: SignRequest): Promise<Signature> {
  if (actor.scope.kind !== "lab" || !actor.userId) throw new HttpError(403, "Only lab staff sign.");
  const allowed = SIGNING_ROLES[request.purpose];
  if (actor.role === "station" || !allowed.includes(actor.role)) {
    throw new HttpError(403, `Your role may not sign this (${SIGNATURE_MEANINGS[request.purpose]}).`);
  }
  const signer = await findSigner(actor.userId);
  if (!signer) throw new HttpError(401, "Sign in again: your account is no longer active.");
  const env = getEnv();
  const email = signer.email.toLowerCase();
  const failures = await countRecentFailures(email, request.address, env.SIGN_IN_WINDOW_S);
  if (failures.byAddress >= env.SIGN_IN_MAX_ATTEMPTS * 4) {
    throw new HttpError(429, "Too many failed password attempts from your address. Wait and try again.");
  }
  await sleep(signInDelayMs(failures.byEmail, env.SIGN_IN_MAX_ATTEMPTS));
  if (!request.password || !(await verifyPassword(request.password, signer.passwordHash))) {
    await recordFailure(email, request.address);
    throw new HttpError(403, "That password is not yours: nothing was signed.");
  }
  await clearFailures(email);
  return insertSignature({
    labId: actor.scope.labId, signerId: signer.id, signerName: signer.name, signerRole: ROLE_TITLES[signer.role],
    purpose: request.purpose, meaning: SIGNATURE_MEANINGS[request.purpose], subjectKind: request.subjectKind, subjectId: request.subjectId,
  });
}
