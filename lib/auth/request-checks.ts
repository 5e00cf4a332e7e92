/** True when every %-escape of `path` decodes (a broken one such as "%E0%A4%A" would crash routing). */
export function hasValidEscapes(path: string): boolean {
  try {
    decodeURIComponent(path);
    return true;
  } catch {
    return false;
  }
}

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * Whether a state-changing request may come from where it says it comes from: an Origin header, when
 * sent (browsers always send it on a POST), must be the app's own; a browser's `Sec-Fetch-Site:
 * cross-site` is refused too. Bench scripts (curl) send neither and authenticate with a station key.
 */
export function originAllowed(method: string, headers: Headers, appOrigin: string): boolean {
  if (SAFE_METHODS.has(method.toUpperCase())) return true;
  const origin = headers.get("origin");
  if (origin !== null && origin !== new URL(appOrigin).origin) return false;
  return headers.get("sec-fetch-site") !== "cross-site";
}
