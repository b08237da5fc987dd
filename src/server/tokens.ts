import "server-only";
import { createHash, randomBytes } from "node:crypto";

/** A 256-bit random token for links; only its SHA-256 is stored. */
export function newLinkToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString("base64url");
  return { token, hash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}
