import type { Actor } from '@/lib/policies';

// Placeholder: replaced by the sign-in work (Auth.js session → Actor). Until then every visitor is anonymous.
export async function getActor(): Promise<Actor> { return null; }
