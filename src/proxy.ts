// Runs before every page request (Next.js Proxy, the file formerly called middleware.ts):
//  1. While the database cannot be reached, answers 503 itself with a small "we'll be back"
//     page instead of a 500 or an error boundary's 200 (an App Router error boundary cannot set
//     a status). Route handlers answer 503 with the JSON error body on their own (withMember,
//     and the sign-in route asks the same liveness probe).
//  2. Gives each page a Content-Security-Policy with a fresh nonce: Next.js reads the nonce from
//     the request's CSP header and puts it on its own scripts (Next.js docs, "Content Security
//     Policy"), so no inline script runs without it.
//  3. Sends Strict-Transport-Security on pages when the app is served over https (RFC 6797).
// /api is left out: a proxy makes Next.js buffer the request body (up to 10 MB, then cut), which
// would break uploads and the body limits of the route handlers.
// The headers that do not depend on the request are in next.config.ts.
import { NextResponse, type NextRequest } from "next/server";
import { env } from "@/env";
import { databaseIsUp } from "@/server/db-liveness";

/** Two years with subdomains: the hstspreload.org minimum, common practice. */
const HSTS = "max-age=63072000; includeSubDomains";

function contentSecurityPolicy(nonce: string, https: boolean): string {
  const dev = process.env.NODE_ENV === "development";
  return [
    "default-src 'self'",
    // 'strict-dynamic': scripts our nonce'd scripts load (Next's chunks) run; nothing else does.
    // React needs eval only in development, for its error stacks (Next.js docs).
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    // <style> elements need the nonce; style attributes (React's style prop in server-rendered
    // HTML: charts, drag and drop) cannot carry one, and cannot run script.
    `style-src 'self' 'nonce-${nonce}'`,
    "style-src-attr 'unsafe-inline'",
    // data: and blob: for the signature pad's image and photo previews.
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "media-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    // The deposit's checkout page is a top-level navigation, not a form post or a frame.
    "form-action 'self'",
    "frame-src 'self'",
    "frame-ancestors 'none'",
    ...(https ? ["upgrade-insecure-requests"] : []),
  ].join("; ");
}

const DOWN_HTML = (nonce: string) => `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>We'll be back shortly · Kilowright</title>
<style nonce="${nonce}">body{font-family:system-ui,sans-serif;background:#FAF7F2;color:#2b2b2b;margin:0;display:grid;place-items:center;min-height:100vh}main{max-width:32rem;padding:2rem}h1{font-size:1.5rem;margin:0 0 .5rem}</style>
</head><body><main><h1>We'll be back shortly</h1>
<p>Kilowright cannot reach its database right now. Nothing you saved is lost. Try again in a minute.</p></main></body></html>`;

function unavailable(https: boolean): NextResponse {
  const headers: Record<string, string> = { "Retry-After": "5", "Cache-Control": "no-store", "X-Content-Type-Options": "nosniff", "X-Frame-Options": "DENY" };
  if (https) headers["Strict-Transport-Security"] = HSTS;
  const nonce = btoa(crypto.randomUUID());
  return new NextResponse(DOWN_HTML(nonce), {
    status: 503,
    headers: { ...headers, "Content-Type": "text/html; charset=utf-8", "Content-Security-Policy": `default-src 'none'; style-src 'nonce-${nonce}'; frame-ancestors 'none'` },
  });
}

export async function proxy(req: NextRequest): Promise<NextResponse> {
  const https = env().APP_URL.startsWith("https:");
  if (!(await databaseIsUp())) return unavailable(https);
  const nonce = btoa(crypto.randomUUID());
  const csp = contentSecurityPolicy(nonce, https);
  const requestHeaders = new Headers(req.headers);
  requestHeaders.set("Content-Security-Policy", csp);
  const res = NextResponse.next({ request: { headers: requestHeaders } });
  res.headers.set("Content-Security-Policy", csp);
  if (https) res.headers.set("Strict-Transport-Security", HSTS);
  return res;
}

export const config = {
  // Pages only: not /api (see above), not the build's static files; prefetches carry no scripts to nonce (Next.js docs).
  matcher: [
    {
      source: "/((?!api/|_next/static|_next/image|favicon.ico|icon.svg|icon-192.png|icon-512.png|apple-touch-icon.png|manifest.webmanifest).*)",
      missing: [
        { type: "header", key: "next-router-prefetch" },
        { type: "header", key: "purpose", value: "prefetch" },
      ],
    },
  ],
};
