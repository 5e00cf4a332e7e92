import "server-only";
import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import { z } from "zod";
import { getEnv } from "./env";

// Reads the messages the local SMTP fake stored as JSON files (development and demo only).
const storedMailSchema = z.object({
  id: z.string(),
  receivedAt: z.string(),
  from: z.string().default(""),
  to: z.array(z.string()).default([]),
  subject: z.string().default("(no subject)"),
  text: z.string().default(""),
});

export type StoredMail = z.infer<typeof storedMailSchema>;

export function outboxEnabled(): boolean {
  return Boolean(getEnv().MAIL_DIR);
}

export async function listOutbox(limit = 100): Promise<StoredMail[]> {
  const dir = getEnv().MAIL_DIR;
  if (!dir) return [];
  let names: string[];
  try {
    names = (await readdir(dir)).filter((n) => n.endsWith(".json")).sort().reverse().slice(0, limit);
  } catch {
    return [];
  }
  const mails = await Promise.all(
    names.map(async (name) => {
      try {
        return storedMailSchema.parse(JSON.parse(await readFile(path.join(dir, name), "utf8")));
      } catch {
        return null;
      }
    }),
  );
  return mails.filter((m): m is StoredMail => m !== null);
}
