import type { IncomingMessage, ServerResponse } from "node:http";
import { invalidRequest } from "./errors";
import { FormError, parseForm } from "./form";
import type { FakeContext } from "./context";
import type { Params } from "./params";

// ── HTTP plumbing ──────────────────────────────────────────────

const MAX_BODY_BYTES = 1024 * 1024;

export function send(res: ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}): void {
  const text = `${JSON.stringify(body, null, 2)}\n`;
  res.writeHead(status, { "content-type": "application/json; charset=utf-8", "content-length": Buffer.byteLength(text), "cache-control": "no-store", ...headers });
  res.end(text);
}

export function sendHtml(res: ServerResponse, status: number, html: string): void {
  res.writeHead(status, { "content-type": "text/html; charset=utf-8", "content-length": Buffer.byteLength(html), "cache-control": "no-store" });
  res.end(html);
}

export function redirect(res: ServerResponse, location: string): void {
  res.writeHead(303, { location, "content-length": 0, "cache-control": "no-store" });
  res.end();
}

export async function readBody(req: IncomingMessage): Promise<string> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    const buf = Buffer.isBuffer(chunk) ? chunk : Buffer.from(String(chunk));
    size += buf.length;
    if (size > MAX_BODY_BYTES) throw invalidRequest("The request body is too large.", undefined, undefined, 413);
    chunks.push(buf);
  }
  return Buffer.concat(chunks).toString("utf8");
}

export function parseParams(text: string): Params {
  try {
    return parseForm(text);
  } catch (err) {
    if (err instanceof FormError) throw invalidRequest(`Invalid request: ${err.message}`);
    throw err;
  }
}

export function checkAuth(ctx: FakeContext, req: IncomingMessage): void {
  const header = req.headers.authorization;
  let key: string | null = null;
  if (header) {
    const bearer = /^Bearer\s+(\S+)\s*$/i.exec(header);
    const basic = /^Basic\s+(\S+)\s*$/i.exec(header);
    if (bearer) key = bearer[1];
    else if (basic) key = Buffer.from(basic[1], "base64").toString("utf8").split(":")[0] || null;
  }
  if (!key) {
    throw invalidRequest(
      "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').",
      undefined,
      undefined,
      401,
    );
  }
  if (key !== ctx.apiKey) {
    const shown = key.length > 8 ? `${key.slice(0, 8)}${"*".repeat(Math.max(0, key.length - 12))}${key.slice(-4)}` : key;
    throw invalidRequest(`Invalid API Key provided: ${shown}`, undefined, "api_key_invalid", 401);
  }
}
