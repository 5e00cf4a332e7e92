import nodemailer, { type Transporter } from "nodemailer";
import { getEnv } from "./env";

// The one SMTP transport. Only the mail job of the worker calls sendMail; everything else queues a
// mail in the outbox (lib/server/mail-outbox.ts), so a mail service that is down never blocks an action.
// No `server-only` marker: the worker (plain Node) imports this module.

let transport: Transporter | undefined;

function getTransport(): Transporter {
  if (!transport) {
    const env = getEnv();
    const auth = env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? "" } : undefined;
    transport = nodemailer.createTransport({
      host: env.SMTP_HOST, port: env.SMTP_PORT, secure: false, ignoreTLS: env.NODE_ENV !== "production", auth,
      connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000,
    });
  }
  return transport;
}

export type Mail = { to: string; subject: string; text: string; html?: string; fromName?: string };

/** The address of MAIL_FROM with the given display name (the lab's name), or MAIL_FROM as configured. */
export function fromHeader(fromName: string | undefined, mailFrom: string): string | { name: string; address: string } {
  if (!fromName) return mailFrom;
  const address = /<([^>]+)>/.exec(mailFrom)?.[1] ?? mailFrom.trim();
  return { name: fromName, address };
}

export async function sendMail(mail: Mail): Promise<void> {
  const { fromName, ...rest } = mail;
  await getTransport().sendMail({ from: fromHeader(fromName, getEnv().MAIL_FROM), ...rest });
}

/** The plain sentence kept for the lab manager when sending failed: never a host, port or stack. */
export function mailFailureSentence(err: unknown): string {
  const code = (err as { code?: string } | null)?.code ?? "";
  if (["ECONNREFUSED", "ESOCKET", "ETIMEDOUT", "ECONNECTION", "EDNS", "ENOTFOUND", "ECONNRESET"].includes(code)) {
    return "The mail service did not answer; the mail is sent again automatically.";
  }
  const response = (err as { responseCode?: number } | null)?.responseCode;
  if (typeof response === "number" && response >= 500) return "The mail service refused this mail (permanent refusal); check the address.";
  if (typeof response === "number") return "The mail service asked to try later; the mail is sent again automatically.";
  return "Sending failed for a reason the mail service did not give; the mail is sent again automatically.";
}
