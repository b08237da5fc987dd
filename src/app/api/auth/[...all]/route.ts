import { auth } from "@/server/auth";
import { BODY_CAPS, readCappedBody } from "@/server/body-limit";
import { databaseIsUp } from "@/server/db-liveness";
import { errorResponse, toErrorResponse } from "@/server/route";

/**
 * better-auth's endpoints. While the database is unreachable, sign-in and the rest answer 503
 * with our JSON error body (the same cached probe as src/proxy.ts) instead of better-auth's 500.
 * A body is read within BODY_CAPS.auth first (413 past it, the rest never buffered), then
 * handed on in a rebuilt Request, since better-auth reads the whole body.
 */
async function handle(req: Request): Promise<Response> {
  if (!(await databaseIsUp())) {
    return errorResponse(503, "database_unavailable", "The database cannot be reached right now. Try again shortly.");
  }
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
