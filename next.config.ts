// Response headers every route gets (issue #14, item 5). The page's Content-Security-Policy
// carries a fresh nonce per request and HSTS depends on APP_URL at run time: both are set in
// src/proxy.ts.
import type { NextConfig } from "next";

/**
 * The camera for job and site photos and the location for "I'm at the house", only for our own
 * pages; every other feature off (our choice).
 */
const PERMISSIONS_POLICY = [
  "camera=(self)",
  "microphone=()",
  "geolocation=(self)",
  "payment=()",
  "usb=()",
  "serial=()",
  "bluetooth=()",
  "hid=()",
  "midi=()",
  "magnetometer=()",
  "gyroscope=()",
  "accelerometer=()",
  "display-capture=()",
  "browsing-topics=()",
].join(", ");

const nextConfig: NextConfig = {
  poweredByHeader: false,
  async headers() {
    return [
      {
        source: "/:path*",
        headers: [
          // Nobody frames Kilowright (clickjacking): the CSP frame-ancestors of src/proxy.ts, and this for older browsers.
          { key: "X-Frame-Options", value: "DENY" },
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
          { key: "Permissions-Policy", value: PERMISSIONS_POLICY },
        ],
      },
      // Files and JSON get no page CSP from the proxy; they must not be framed either.
      { source: "/api/:path*", headers: [{ key: "Content-Security-Policy", value: "frame-ancestors 'none'" }] },
      // The homeowner's link is the key to their proposal: no page it links to learns it (the later rule wins).
      { source: "/p/:path*", headers: [{ key: "Referrer-Policy", value: "no-referrer" }] },
    ];
  },
};

export default nextConfig;
