import { and, eq, isNull } from "drizzle-orm";
import { getDb } from "@/db/client";
import { signatures, users, type Signature, type SignaturePurpose } from "@/db/schema";

/** The enabled account that is about to sign, with its password hash; undefined when gone or disabled. */
export async function findSigner(userId: string) {
  const rows = await getDb()
    .select({ id: users.id, email: users.email, name: users.name, role: users.role, organisationId: users.organisationId, passwordHash: users.passwordHash })
    .from(users)
    .where(and(eq(users.id, userId), isNull(users.disabledAt)))
    .limit(1);
  return rows[0];
}

export async function insertSignature(values: {
  labId: string; signerId: string; signerName: string; signerRole: string; purpose: SignaturePurpose; meaning: string;
  subjectKind: "unit" | "report" | "capture"; subjectId: string;
}): Promise<Signature> {
  const [row] = await getDb().insert(signatures).values(values).returning();
  if (!row) throw new Error("The signature was not stored");
  return row;
}

export async function findSignature(signatureId: string): Promise<Signature | undefined> {
  const rows = await getDb().select().from(signatures).where(eq(signatures.id, signatureId)).limit(1);
  return rows[0];
}
