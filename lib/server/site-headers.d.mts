export declare const SECURITY_HEADERS: Readonly<{
  "X-Frame-Options": "DENY";
  "X-Content-Type-Options": "nosniff";
  "Referrer-Policy": "same-origin";
  "Permissions-Policy": "camera=(), microphone=(), geolocation=()";
}>;
export declare const FRAME_POLICY: Readonly<{ "Content-Security-Policy": "frame-ancestors 'none'" }>;
export declare const OWN_POLICY_PATHS: readonly string[];
export declare const SITE_HEADERS: Readonly<typeof SECURITY_HEADERS & typeof FRAME_POLICY>;
export declare function siteHeaderRules(): Array<{ source: string; headers: Array<{ key: string; value: string }> }>;
