import 'server-only';
import { cache } from 'react';
import { User } from '@/db/models';
import type { Actor } from '@/lib/policies';
import { auth } from './index';

/** The Actor the policies see for a user row (no row, or a disabled one, is a visitor). */
export function actorFromUser(user: User | null): Actor {
  if (!user || user.disabledAt) return null;
  return {
    id: user.id,
    role: user.role,
    email: user.email,
    emailVerified: !!user.emailVerified,
    disabled: false,
    createdAt: user.createdAt,
    units: user.units,
  };
}

/**
 * Who is making this request: reads the Auth.js database session from its
 * cookie, then loads the user fresh from MariaDB (so a role change or a
 * disabled account counts at once, never a stale copy). Null for visitors,
 * for expired or unknown sessions, and for disabled accounts. Cached for the
 * length of one server render; never throws for a missing session.
 */
export const getActor = cache(async (): Promise<Actor> => {
  const session = await auth();
  const id = session?.user?.id;
  if (!id) return null;
  return actorFromUser(await User.findByPk(id));
});
