import 'server-only';
import NextAuth from 'next-auth';
import { buildAuthConfig } from './config';

/**
 * Auth.js for Trialbed. `handlers` serve /api/auth/* (see the route file,
 * which adds the sign-in mail rate limit), `auth()` reads the session,
 * `signIn`/`signOut` are the server-side helpers used by server actions.
 * Code that needs the person acting uses getActor() from '@/lib/auth/actor'.
 */
export const { auth, handlers, signIn, signOut } = NextAuth(buildAuthConfig());
