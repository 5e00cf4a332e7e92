/** @type {import('next').NextConfig} */
const nextConfig = {
  poweredByHeader: false,
  // The test suite builds into its own folder so it never disturbs a running demo.
  distDir: process.env.EMFOLIO_DIST_DIR || ".next",
  serverExternalPackages: ["pdfkit", "bullmq", "ioredis", "pg", "smtp-server", "mailparser"],
  typedRoutes: false,
  // Type-checking runs once in `npm test` (tsc --noEmit); the build does not repeat it.
  typescript: { ignoreBuildErrors: true },
  // No framing (clickjacking), no MIME sniffing of served files, no full URLs in Referer headers.
  async headers() {
    return [
      {
        source: "/:path*",
        headers: [
          { key: "X-Frame-Options", value: "DENY" },
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "Referrer-Policy", value: "same-origin" },
          { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=()" },
        ],
      },
      // Not on attachment downloads: their route sends its own, stricter policy (sandbox), which a
      // second header here would replace.
      { source: "/((?!api/attachments/).*)", headers: [{ key: "Content-Security-Policy", value: "frame-ancestors 'none'" }] },
    ];
  },
  experimental: {
    // forbidden(): a page refused to a role answers 403 with the app's menu.
    authInterrupts: true,
    serverActions: { bodySizeLimit: "2mb" },
  },
};

export default nextConfig;
