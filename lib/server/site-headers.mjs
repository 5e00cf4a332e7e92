// The site's security headers, in one place for both doors: next.config.mjs gives them to every
// answer Next sends, and lib/server/health-probe.ts to the probes scripts/serve.ts answers before
// Next. Plain ESM because Next loads next.config.mjs without compiling TypeScript; the types are in
// site-headers.d.mts.

/** No framing (clickjacking), no MIME sniffing of served files, no full URLs in Referer headers. */
export const SECURITY_HEADERS = Object.freeze({
  "X-Frame-Options": "DENY",
  "X-Content-Type-Options": "nosniff",
  "Referrer-Policy": "same-origin",
  "Permissions-Policy": "camera=(), microphone=(), geolocation=()",
});

/**
 * Not on attachment downloads: their route sends its own, stricter policy (sandbox), which a
 * second header here would replace.
 */
export const FRAME_POLICY = Object.freeze({ "Content-Security-Policy": "frame-ancestors 'none'" });

/** What every answer outside /api/attachments/ carries. */
export const SITE_HEADERS = Object.freeze({ ...SECURITY_HEADERS, ...FRAME_POLICY });

const asList = (headers) => Object.entries(headers).map(([key, value]) => ({ key, value }));

/** The `headers()` rules of next.config.mjs. */
export function siteHeaderRules() {
  return [
    { source: "/:path*", headers: asList(SECURITY_HEADERS) },
    { source: "/((?!api/attachments/).*)", headers: asList(FRAME_POLICY) },
  ];
}
