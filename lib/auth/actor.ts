import type { Actor } from '@/lib/policies';

/**
 * The signed-in actor of the current request.
 * Placeholder: replaced by the sign-in work (it reads the Auth.js database session).
 * Until then every request is a visitor.
 */
export async function getActor(): Promise<Actor> { return null; }
