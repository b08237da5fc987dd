import { errorResponse } from "@/server/route";
import { auth } from "@/server/auth";
import { databaseIsUp } from "@/server/db-liveness";

/**
 * better-auth's endpoints. While the database is unreachable, sign-in and the rest answer 503
 * with our JSON error body (the same cached probe as src/proxy.ts) instead of better-auth's 500.
 */
async function handle(req: Request): Promise<Response> {
  if (!(await databaseIsUp())) {
    return errorResponse(503, "database_unavailable", "The database cannot be reached right now. Try again shortly.");
  }
  return auth().handler(req);
}
export { handle as GET, handle as POST };
