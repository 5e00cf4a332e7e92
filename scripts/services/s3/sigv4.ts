// Verifies AWS Signature Version 4 on requests to the local object store: the Authorization header
// form the SDK sends and the presigned-URL (query) form browsers and bench PCs use. Written here
// rather than taken from a package: the SDK's signer only signs, and re-signing a received request
// through it normalises headers and query the way the sender did not, so the comparison must be
// built from the request exactly as it arrived (canonical request as the S3 signing rules give it).
import { createHash, createHmac, timingSafeEqual } from "node:crypto";

export type Credentials = { accessKeyId: string; secretAccessKey: string; region: string };

/** What a verified request was signed for: the payload hash to check the body against, if any. */
export type Verified = { payloadSha256Hex: string | null; presigned: boolean };

export class SignatureError extends Error {
  constructor(readonly status: number, readonly code: string, message: string) {
    super(message);
  }
}

const ALGORITHM = "AWS4-HMAC-SHA256";
const MAX_CLOCK_SKEW_MS = 15 * 60 * 1000;
const MAX_PRESIGN_S = 7 * 24 * 3600;

/** RFC 3986 encoding as S3's canonical query string uses it. */
function encode(s: string): string {
  return encodeURIComponent(s).replace(/[!'()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
}

function decode(s: string): string {
  try {
    return decodeURIComponent(s.replace(/\+/g, "%20"));
  } catch {
    throw new SignatureError(400, "InvalidArgument", "The query string is not valid percent-encoding");
  }
}

function queryPairs(rawQuery: string): [string, string][] {
  if (!rawQuery) return [];
  return rawQuery.split("&").filter(Boolean).map((part) => {
    const eq = part.indexOf("=");
    return eq < 0 ? [decode(part), ""] : [decode(part.slice(0, eq)), decode(part.slice(eq + 1))];
  });
}

function canonicalQuery(pairs: [string, string][]): string {
  return pairs
    .map(([k, v]) => [encode(k), encode(v)] as const)
    .sort((a, b) => (a[0] === b[0] ? (a[1] < b[1] ? -1 : a[1] > b[1] ? 1 : 0) : a[0] < b[0] ? -1 : 1))
    .map(([k, v]) => `${k}=${v}`)
    .join("&");
}

function headerValue(headers: Record<string, string | string[] | undefined>, name: string): string | undefined {
  const v = headers[name];
  if (v === undefined) return undefined;
  return (Array.isArray(v) ? v : [v]).map((x) => x.trim().replace(/\s+/g, " ")).join(",");
}

function sha256Hex(s: string): string {
  return createHash("sha256").update(s, "utf8").digest("hex");
}

function hmac(key: Buffer | string, data: string): Buffer {
  return createHmac("sha256", key).update(data, "utf8").digest();
}

/** `20261202T143000Z` as a Date, or null. */
function parseAmzDate(s: string | undefined): Date | null {
  const m = /^(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})Z$/.exec(s ?? "");
  if (!m) return null;
  const [y, mo, d, h, mi, se] = m.slice(1).map(Number) as [number, number, number, number, number, number];
  return new Date(Date.UTC(y, mo - 1, d, h, mi, se));
}

type Parsed = { accessKeyId: string; scope: string; scopeDate: string; scopeRegion: string; scopeService: string; signedHeaders: string[]; signature: string; amzDate: string };

function parseCredential(credential: string): Omit<Parsed, "signedHeaders" | "signature" | "amzDate"> {
  const [accessKeyId, scopeDate, scopeRegion, scopeService, terminal, ...rest] = credential.split("/");
  if (!accessKeyId || !scopeDate || !scopeRegion || !scopeService || terminal !== "aws4_request" || rest.length > 0) {
    throw new SignatureError(400, "AuthorizationHeaderMalformed", "The credential scope is malformed: expected key/date/region/s3/aws4_request");
  }
  return { accessKeyId, scope: [scopeDate, scopeRegion, scopeService, terminal].join("/"), scopeDate, scopeRegion, scopeService };
}

export type IncomingRequest = { method: string; url: string; headers: Record<string, string | string[] | undefined> };

/**
 * Checks the request's signature against the credentials; throws SignatureError (403 for a missing,
 * wrong or expired signature, 400 for a malformed one). `now` is injectable for tests.
 */
export function verifySignature(req: IncomingRequest, creds: Credentials, now = new Date()): Verified {
  const q = req.url.indexOf("?");
  const rawPath = q < 0 ? req.url : req.url.slice(0, q);
  const pairs = queryPairs(q < 0 ? "" : req.url.slice(q + 1));
  const query = new Map(pairs.map(([k, v]) => [k, v]));
  const auth = headerValue(req.headers, "authorization");
  let parsed: Parsed;
  let payloadHash: string;
  let presigned = false;
  if (auth) {
    if (!auth.startsWith(`${ALGORITHM} `)) throw new SignatureError(400, "InvalidArgument", `Only ${ALGORITHM} signatures are accepted`);
    const fields = new Map(auth.slice(ALGORITHM.length + 1).split(/,\s*/).map((f) => {
      const eq = f.indexOf("=");
      return [f.slice(0, eq).trim(), f.slice(eq + 1).trim()] as const;
    }));
    const credential = fields.get("Credential");
    const signedHeaders = fields.get("SignedHeaders");
    const signature = fields.get("Signature");
    if (!credential || !signedHeaders || !signature) throw new SignatureError(400, "AuthorizationHeaderMalformed", "The Authorization header lacks Credential, SignedHeaders or Signature");
    const amzDate = headerValue(req.headers, "x-amz-date") ?? "";
    parsed = { ...parseCredential(credential), signedHeaders: signedHeaders.split(";"), signature, amzDate };
    const date = parseAmzDate(amzDate);
    if (!date) throw new SignatureError(403, "AccessDenied", "The request has no valid x-amz-date");
    if (Math.abs(now.getTime() - date.getTime()) > MAX_CLOCK_SKEW_MS) throw new SignatureError(403, "RequestTimeTooSkewed", "The request time differs from the store's clock by more than 15 minutes");
    const declared = headerValue(req.headers, "x-amz-content-sha256");
    if (!declared) throw new SignatureError(400, "InvalidRequest", "Signed requests must carry x-amz-content-sha256");
    payloadHash = declared;
  } else if (query.get("X-Amz-Algorithm") !== undefined) {
    presigned = true;
    if (query.get("X-Amz-Algorithm") !== ALGORITHM) throw new SignatureError(400, "InvalidArgument", `Only ${ALGORITHM} presigned URLs are accepted`);
    const credential = query.get("X-Amz-Credential");
    const signedHeaders = query.get("X-Amz-SignedHeaders");
    const signature = query.get("X-Amz-Signature");
    const amzDate = query.get("X-Amz-Date") ?? "";
    const expires = Number(query.get("X-Amz-Expires"));
    if (!credential || !signedHeaders || !signature) throw new SignatureError(400, "AuthorizationQueryParametersError", "The presigned URL lacks X-Amz-Credential, X-Amz-SignedHeaders or X-Amz-Signature");
    const date = parseAmzDate(amzDate);
    if (!date || !Number.isInteger(expires) || expires < 1 || expires > MAX_PRESIGN_S) {
      throw new SignatureError(400, "AuthorizationQueryParametersError", "The presigned URL has no valid X-Amz-Date or X-Amz-Expires");
    }
    if (now.getTime() > date.getTime() + expires * 1000) throw new SignatureError(403, "AccessDenied", "Request has expired");
    if (date.getTime() - now.getTime() > MAX_CLOCK_SKEW_MS) throw new SignatureError(403, "AccessDenied", "The presigned URL is dated in the future");
    parsed = { ...parseCredential(credential), signedHeaders: signedHeaders.split(";"), signature, amzDate };
    payloadHash = query.get("X-Amz-Content-Sha256") ?? "UNSIGNED-PAYLOAD";
  } else {
    throw new SignatureError(403, "AccessDenied", "Anonymous requests are refused: sign the request with the store's credentials");
  }
  if (parsed.accessKeyId !== creds.accessKeyId) throw new SignatureError(403, "InvalidAccessKeyId", "The access key id you provided does not exist in our records");
  if (parsed.scopeService !== "s3" || parsed.scopeRegion !== creds.region || parsed.scopeDate !== parsed.amzDate.slice(0, 8)) {
    throw new SignatureError(403, "SignatureDoesNotMatch", `The credential scope must be <date>/${creds.region}/s3/aws4_request for the request's date`);
  }
  if (!parsed.signedHeaders.includes("host")) throw new SignatureError(403, "SignatureDoesNotMatch", "The host header must be signed");
  const canonicalHeaders = parsed.signedHeaders.map((name) => {
    const value = headerValue(req.headers, name);
    if (value === undefined) throw new SignatureError(403, "SignatureDoesNotMatch", `The signed header ${name} is missing from the request`);
    return `${name}:${value}\n`;
  }).join("");
  const signedQuery = presigned ? pairs.filter(([k]) => k !== "X-Amz-Signature") : pairs;
  const canonicalRequest = [req.method, rawPath, canonicalQuery(signedQuery), canonicalHeaders, parsed.signedHeaders.join(";"), payloadHash].join("\n");
  const stringToSign = [ALGORITHM, parsed.amzDate, parsed.scope, sha256Hex(canonicalRequest)].join("\n");
  let key = hmac(`AWS4${creds.secretAccessKey}`, parsed.scopeDate);
  for (const part of [parsed.scopeRegion, parsed.scopeService, "aws4_request"]) key = hmac(key, part);
  const expected = createHmac("sha256", key).update(stringToSign, "utf8").digest();
  const given = Buffer.from(/^[0-9a-f]{64}$/.test(parsed.signature) ? parsed.signature : "", "hex");
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) {
    throw new SignatureError(403, "SignatureDoesNotMatch", "The request signature we calculated does not match the signature you provided. Check your key and signing method");
  }
  if (/^STREAMING-/.test(payloadHash)) throw new SignatureError(501, "NotImplemented", "Chunked (streaming) payload signing is not supported by the local store: send a plain body");
  return { payloadSha256Hex: /^[0-9a-f]{64}$/.test(payloadHash) ? payloadHash : null, presigned };
}
