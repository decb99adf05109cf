import type { Role } from "~/lib/permissions";

export interface SessionUser {
  id: string;
  email: string;
  name: string;
  role: Role;
  organisationId: string;
}

/** The signed-in user, or null. Real session lookup lands with the accounts work (issue 3). */
export async function getOptionalUser(_request: Request): Promise<SessionUser | null> {
  return null;
}
