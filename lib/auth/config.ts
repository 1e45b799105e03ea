import 'server-only';
import SequelizeAdapter from '@auth/sequelize-adapter';
import type { NextAuthConfig, Session as AuthSession } from 'next-auth';
import Nodemailer from 'next-auth/providers/nodemailer';
import { sequelize } from '@/db';
import { Account, Session, User, VerificationToken } from '@/db/models';
import { getEnv } from '@/lib/env';
import { sendSignInMail } from '@/lib/mail/sign-in-mail';
import { SESSION_MAX_AGE_SECONDS, SESSION_UPDATE_AGE_SECONDS, usesSecureCookies } from './cookies';

/** How long an e-mail sign-in link works. */
export const SIGN_IN_LINK_MAX_AGE_SECONDS = 24 * 60 * 60;

/** Auth.js errors caused by the request (bad or stale input), logged in one line. */
const CLIENT_ERRORS = new Set(['MissingCSRF', 'Verification', 'AccessDenied', 'InvalidCheck', 'UnknownAction']);

type AdapterModels = NonNullable<Parameters<typeof SequelizeAdapter>[1]>['models'];

/**
 * Builds the Auth.js configuration: e-mail links over SMTP (the local capture
 * server or a hosted provider, from SMTP_*), database sessions in our own
 * tables through the Sequelize adapter (tables from migrations, never synced),
 * our own sign-in pages, and no sign-in for disabled accounts.
 */
export function buildAuthConfig(): NextAuthConfig {
  const env = getEnv();
  return {
    adapter: SequelizeAdapter(sequelize, {
      // Our model classes carry extra columns (role, units …); the adapter only needs the Auth.js ones.
      models: { User, Account, Session, VerificationToken } as unknown as AdapterModels,
      synchronize: false,
    }),
    session: { strategy: 'database', maxAge: SESSION_MAX_AGE_SECONDS, updateAge: SESSION_UPDATE_AGE_SECONDS },
    trustHost: true,
    // Cookies follow the public address: Secure and `__Secure-`/`__Host-` prefixed behind https.
    useSecureCookies: usesSecureCookies(env.AUTH_URL),
    providers: [
      Nodemailer({
        server: {
          host: env.SMTP_HOST,
          port: env.SMTP_PORT,
          secure: env.SMTP_SECURE === '1',
          auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD } : undefined,
        },
        from: env.MAIL_FROM,
        maxAge: SIGN_IN_LINK_MAX_AGE_SECONDS,
        async sendVerificationRequest({ identifier, url, expires }) {
          await sendSignInMail({ to: identifier, url, expires });
        },
      }),
    ],
    pages: { signIn: '/signin', verifyRequest: '/signin/check-email', error: '/signin' },
    logger: {
      // A stale link, a missing CSRF token or a refused account is the visitor's
      // doing, not ours: one line. Anything else keeps its stack.
      error(error) {
        const type = (error as { type?: string }).type ?? error.name;
        if (CLIENT_ERRORS.has(type)) console.warn(`[auth] ${type}: ${error.message.split('\n')[0]}`);
        else console.error('[auth]', error);
      },
    },
    callbacks: {
      // A disabled account gets no link and no session.
      signIn({ user }) {
        return !(user as { disabledAt?: Date | null }).disabledAt;
      },
      // What /api/auth/session tells the browser: who and until when — never the
      // session token itself (the cookie is HttpOnly so scripts cannot read it).
      session({ session, user }): AuthSession {
        return { expires: session.expires, user: { id: user.id, email: user.email, name: user.name ?? null } };
      },
    },
  };
}
