import "server-only";
import type { Role } from "@/lib/enums";

/**
 * Who is asking: the signed-in person, their company and role. Its own module so the session
 * reuse can name it without importing the session (auth → session-reuse → session → auth).
 */
export type Member = {
  userId: string;
  name: string;
  email: string;
  membershipId: string;
  companyId: string;
  companyName: string;
  role: Role;
};
