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
 * Not on attachment and calibration-certificate downloads: their routes send their own, stricter
 * policy (sandbox), which this header would replace (a next.config header overwrites a route
 * handler's header of the same name).
 */
export const FRAME_POLICY = Object.freeze({ "Content-Security-Policy": "frame-ancestors 'none'" });

/** Where the route sends its own Content-Security-Policy (see FRAME_POLICY). */
export const OWN_POLICY_PATHS = Object.freeze(["api/attachments/", "api/instruments/[^/]+/certificates/"]);

/** What every other answer carries. */
export const SITE_HEADERS = Object.freeze({ ...SECURITY_HEADERS, ...FRAME_POLICY });

const asList = (headers) => Object.entries(headers).map(([key, value]) => ({ key, value }));

/** The `headers()` rules of next.config.mjs. */
export function siteHeaderRules() {
  return [
    { source: "/:path*", headers: asList(SECURITY_HEADERS) },
    { source: `/((?!${OWN_POLICY_PATHS.join("|")}).*)`, headers: asList(FRAME_POLICY) },
  ];
}
