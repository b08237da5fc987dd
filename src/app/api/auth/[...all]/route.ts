import { auth } from "@/server/auth";
import { BODY_CAPS, readCappedBody } from "@/server/body-limit";
import { toErrorResponse } from "@/server/route";

/**
 * better-auth's endpoints. A body is read within BODY_CAPS.auth first (413 past it, the rest
 * never buffered), then handed on in a rebuilt Request, since better-auth reads the whole body.
 */
async function handle(req: Request): Promise<Response> {
  if (req.method === "GET" || req.method === "HEAD" || !req.body) return auth().handler(req);
  let body: Uint8Array<ArrayBuffer>;
  try {
    body = await readCappedBody(req, BODY_CAPS.auth);
  } catch (err) {
    return toErrorResponse(err);
  }
  return auth().handler(new Request(req.url, { method: req.method, headers: req.headers, body, signal: req.signal }));
}

export { handle as GET, handle as POST };
