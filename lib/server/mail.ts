import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { getEnv } from "./env";

let transport: Transporter | undefined;

function getTransport(): Transporter {
  if (!transport) {
    const env = getEnv();
    const auth = env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? "" } : undefined;
    transport = nodemailer.createTransport({ host: env.SMTP_HOST, port: env.SMTP_PORT, secure: false, ignoreTLS: env.NODE_ENV !== "production", auth });
  }
  return transport;
}

export type Mail = { to: string; subject: string; text: string };

export async function sendMail(mail: Mail): Promise<void> {
  await getTransport().sendMail({ from: getEnv().MAIL_FROM, ...mail });
}
