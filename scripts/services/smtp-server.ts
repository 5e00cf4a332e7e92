/**
 * Local SMTP fake for development and tests (started by scripts/services.sh).
 *
 *   node_modules/.bin/tsx scripts/services/smtp-server.ts --port 2529 --dir .data/mail --secret-file .data/smtp-secret [--also-listen HOST]
 *
 * Listens on 127.0.0.1 (and each --also-listen address: EMFOLIO_BIND_ADDRESS), no TLS. Requires AUTH (PLAIN or LOGIN) as user `emfolio` with the
 * password in --secret-file before MAIL FROM; anything else is refused (535, or 530 without AUTH). Each message is
 * stored as two files with the same base name:
 *   <dir>/<timestamp>-<id>.eml   the raw message as received
 *   <dir>/<timestamp>-<id>.json  a StoredMail record (see the type below)
 * <timestamp> is the UTC receive time as YYYYMMDDTHHMMSSmmmZ, so names sort in
 * arrival order. The .json file is written last and atomically (temp file +
 * rename): a reader that lists *.json never sees a half-written message.
 */
import { randomBytes, timingSafeEqual } from "node:crypto";
import { mkdirSync, readFileSync, renameSync, writeFileSync } from "node:fs";
import path from "node:path";
import { simpleParser, type AddressObject } from "mailparser";
import { SMTPServer, type SMTPServerAddress } from "smtp-server";
import { alsoListen, alsoListenHosts } from "./also-listen";

/** The JSON record written for each message (format version 1). */
export interface StoredMail {
  version: 1;
  id: string;
  /** Date header of the message (ISO 8601), or the receive time when absent. */
  date: string;
  receivedAt: string;
  /** The From header as text, e.g. `Emfolio <noreply@emfolio.local>`. */
  from: string;
  /** Addresses from the To header (envelope recipients when it has none). */
  to: string[];
  /** The To header as text, with display names. */
  toText: string;
  cc: string[];
  subject: string;
  text: string | null;
  html: string | null;
  messageId: string | null;
  /** SMTP envelope: MAIL FROM and every RCPT TO (includes Bcc recipients). */
  envelope: { from: string | null; to: string[] };
  attachments: { filename: string | null; contentType: string; size: number }[];
  /** Size of the raw message in bytes. */
  size: number;
  /** Base name of the raw message file beside this one. */
  eml: string;
}

function arg(name: string, fallback: string): string {
  const i = process.argv.indexOf(`--${name}`);
  const v = i >= 0 ? process.argv[i + 1] : undefined;
  return v ?? fallback;
}

const port = Number(arg("port", process.env.EMFOLIO_SMTP_PORT ?? "2529"));
const dir = path.resolve(arg("dir", ".data/mail"));
const MAX_SIZE = 25 * 1024 * 1024;
/** The one account the fake knows; its password is the shared secret. */
export const SMTP_USER = "emfolio";
const secretFile = arg("secret-file", "");
if (!secretFile) {
  console.error("smtp-server: --secret-file is required (the fake refuses mail without its password)");
  process.exit(2);
}
const secret = Buffer.from(readFileSync(secretFile, "utf8").trim());
if (secret.length < 16) {
  console.error(`smtp-server: the secret in ${secretFile} is shorter than 16 characters`);
  process.exit(2);
}

function secretMatches(user: string | null | undefined, password: string | null | undefined): boolean {
  const given = Buffer.from(password ?? "");
  return user === SMTP_USER && given.length === secret.length && timingSafeEqual(given, secret);
}

mkdirSync(dir, { recursive: true });

function addresses(a: AddressObject | AddressObject[] | undefined): string[] {
  if (!a) return [];
  const list = Array.isArray(a) ? a : [a];
  const out: string[] = [];
  for (const obj of list) {
    for (const v of obj.value) {
      if (v.address) out.push(v.address);
      for (const g of v.group ?? []) if (g.address) out.push(g.address);
    }
  }
  return out;
}

function stamp(d: Date): string {
  return d.toISOString().replace(/[-:]/g, "").replace(".", "");
}

function writeAtomic(file: string, data: string | Buffer): void {
  const tmp = `${file}.tmp-${process.pid}`;
  writeFileSync(tmp, data);
  renameSync(tmp, file);
}

function envelopeAddress(a: SMTPServerAddress | false): string | null {
  return a ? a.address : null;
}

async function store(raw: Buffer, envelope: StoredMail["envelope"]): Promise<string> {
  const receivedAt = new Date();
  const id = randomBytes(6).toString("hex");
  const base = `${stamp(receivedAt)}-${id}`;
  writeAtomic(path.join(dir, `${base}.eml`), raw);

  const parsed = await simpleParser(raw);
  const to = addresses(parsed.to);
  const record: StoredMail = {
    version: 1,
    id,
    date: (parsed.date ?? receivedAt).toISOString(),
    receivedAt: receivedAt.toISOString(),
    from: parsed.from?.text ?? envelope.from ?? "",
    to: to.length > 0 ? to : envelope.to,
    toText: (Array.isArray(parsed.to) ? parsed.to.map((a) => a.text).join(", ") : parsed.to?.text) ?? envelope.to.join(", "),
    cc: addresses(parsed.cc),
    subject: parsed.subject ?? "",
    text: parsed.text ?? null,
    html: typeof parsed.html === "string" ? parsed.html : null,
    messageId: parsed.messageId ?? null,
    envelope,
    attachments: parsed.attachments.map((a) => ({
      filename: a.filename ?? null,
      contentType: a.contentType,
      size: a.size,
    })),
    size: raw.length,
    eml: `${base}.eml`,
  };
  writeAtomic(path.join(dir, `${base}.json`), `${JSON.stringify(record, null, 2)}\n`);
  return base;
}

const server = new SMTPServer({
  name: "emfolio-mail-fake",
  banner: "Emfolio local mail fake (messages are stored, never delivered)",
  secure: false,
  disabledCommands: ["STARTTLS"],
  authOptional: false,
  authMethods: ["PLAIN", "LOGIN"],
  allowInsecureAuth: true,
  size: MAX_SIZE,
  logger: false,
  onConnect(session, callback) {
    const ip = session.remoteAddress.replace(/^::ffff:/, "");
    if (ip === "127.0.0.1" || ip === "::1" || ip.startsWith("127.")) return callback();
    return callback(new Error("loopback connections only"));
  },
  onAuth(auth, session, callback) {
    if (secretMatches(auth.username, auth.password)) return callback(null, { user: SMTP_USER });
    console.log(`${new Date().toISOString()} refused AUTH from ${session.remoteAddress} as ${JSON.stringify(auth.username ?? "")}`);
    const err = new Error("Authentication failed: wrong user or password") as Error & { responseCode: number };
    err.responseCode = 535;
    return callback(err);
  },
  onData(stream, session, callback) {
    const chunks: Buffer[] = [];
    stream.on("data", (c: Buffer) => chunks.push(c));
    stream.on("error", (err) => callback(err));
    stream.on("end", () => {
      if ((stream as unknown as { sizeExceeded?: boolean }).sizeExceeded) {
        const err = new Error(`message exceeds ${MAX_SIZE} bytes`) as Error & { responseCode: number };
        err.responseCode = 552;
        return callback(err);
      }
      const envelope = {
        from: envelopeAddress(session.envelope.mailFrom),
        to: session.envelope.rcptTo.map((r) => r.address),
      };
      store(Buffer.concat(chunks), envelope)
        .then((base) => {
          console.log(`${new Date().toISOString()} stored ${base} from=${envelope.from ?? "-"} to=${envelope.to.join(",")}`);
          callback(null, `Stored as ${base}`);
        })
        .catch((err: unknown) => {
          console.error(`${new Date().toISOString()} failed to store message:`, err);
          callback(err instanceof Error ? err : new Error(String(err)));
        });
    });
  },
});

server.on("error", (err: Error & { code?: string }) => {
  console.error(`${new Date().toISOString()} smtp error:`, err.message);
  if (err.code === "EADDRINUSE" || err.code === "EACCES") process.exit(1);
});

server.listen(port, "127.0.0.1", () => {
  console.log(`${new Date().toISOString()} emfolio smtp fake listening on 127.0.0.1:${port}, storing in ${dir}`);
  alsoListen(server.server, alsoListenHosts(), port, (line) => console.log(`${new Date().toISOString()} ${line}`));
});

function shutdown(signal: string): void {
  console.log(`${new Date().toISOString()} ${signal}: closing`);
  server.close(() => process.exit(0));
  setTimeout(() => process.exit(0), 3000).unref();
}
process.on("SIGTERM", () => shutdown("SIGTERM"));
process.on("SIGINT", () => shutdown("SIGINT"));
