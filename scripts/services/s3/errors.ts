// S3-shaped error answers of the local object store's gate (the SDK reads <Code> as the error name).
import type { ServerResponse } from "node:http";

export class S3Failure extends Error {
  constructor(readonly status: number, readonly code: string, message: string) {
    super(message);
  }
}

function xmlEscape(s: string): string {
  return s.replace(/[<>&"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

export function sendError(res: ServerResponse, status: number, code: string, message: string, extraHeaders: Record<string, string> = {}): void {
  if (res.headersSent) {
    res.destroy();
    return;
  }
  const body = `<?xml version="1.0" encoding="UTF-8"?>\n<Error><Code>${xmlEscape(code)}</Code><Message>${xmlEscape(message)}</Message></Error>\n`;
  res.writeHead(status, { ...extraHeaders, "Content-Type": "application/xml", "Content-Length": Buffer.byteLength(body), Connection: "close" });
  res.end(body);
}
