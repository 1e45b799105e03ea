import { describe, expect, it } from 'vitest';
import { clientIpFrom } from '@/lib/auth/client-ip';
import { sessionCookieName, sessionCookieOptions } from '@/lib/auth/cookies';
import { isSameOriginRequest } from '@/lib/http/same-origin';
import { can, type Actor } from '@/lib/policies';

const actor = (role: NonNullable<Actor>['role'], extra: Partial<NonNullable<Actor>> = {}): Actor => ({ id: `id-${role}`, role, emailVerified: true, ...extra });

describe('session cookie shape', () => {
  it('is the Auth.js name, __Secure- prefixed and Secure behind https, always HttpOnly and SameSite=Lax', () => {
    const expires = new Date('2027-01-01T00:00:00Z');
    expect(sessionCookieName('http://localhost:3000')).toBe('authjs.session-token');
    expect(sessionCookieName('https://trialbed.example')).toBe('__Secure-authjs.session-token');
    expect(sessionCookieOptions('http://localhost:3000', expires)).toEqual({ httpOnly: true, sameSite: 'lax', path: '/', secure: false, expires });
    expect(sessionCookieOptions('https://trialbed.example', expires).secure).toBe(true);
  });
});

describe('client address for rate limits', () => {
  it('takes the right-most x-forwarded-for entry (the nearest trusted hop)', () => {
    expect(clientIpFrom(new Headers({ 'x-forwarded-for': '10.0.0.9, 203.0.113.5' }))).toBe('203.0.113.5');
    expect(clientIpFrom(new Headers({ 'x-forwarded-for': '::ffff:127.0.0.1' }))).toBe('127.0.0.1');
    expect(clientIpFrom(new Headers())).toBe('unknown');
  });
});

describe('same-origin guard', () => {
  const req = (method: string, headers: Record<string, string>) => new Request('http://127.0.0.1:4000/api/account', { method, headers });
  it('lets reads and same-site writes through, refuses cross-site writes', () => {
    expect(isSameOriginRequest(req('GET', { origin: 'https://evil.example' }))).toBe(true);
    expect(isSameOriginRequest(req('PATCH', { origin: 'http://127.0.0.1:4000', host: '127.0.0.1:4000' }))).toBe(true);
    expect(isSameOriginRequest(req('PATCH', { origin: new URL(process.env.AUTH_URL ?? 'http://localhost:3000').origin }))).toBe(true);
    expect(isSameOriginRequest(req('PATCH', {}))).toBe(true);
    expect(isSameOriginRequest(req('PATCH', { origin: 'https://evil.example', host: '127.0.0.1:4000' }))).toBe(false);
    expect(isSameOriginRequest(req('POST', { origin: 'null' }))).toBe(false);
    expect(isSameOriginRequest(req('DELETE', { 'sec-fetch-site': 'cross-site' }))).toBe(false);
    expect(isSameOriginRequest(req('POST', { 'sec-fetch-site': 'same-site' }))).toBe(true);
  });
});

describe('account policies', () => {
  it('only admins change roles; nobody disables themselves', () => {
    expect(['reader', 'contributor', 'editor', 'moderator'].map((r) => can(actor(r as never), 'user.change-role'))).toEqual([false, false, false, false]);
    expect(can(actor('admin'), 'user.change-role')).toBe(true);
    expect(can(actor('admin'), 'user.disable', { userId: 'someone-else' })).toBe(true);
    expect(can(actor('admin'), 'user.disable', { userId: 'id-admin' })).toBe(false);
    expect(can(actor('admin'), 'user.disable')).toBe(false);
    expect(can(null, 'user.manage')).toBe(false);
  });
  it('the licence is for verified readers; a disabled account can do nothing', () => {
    expect(can(actor('reader'), 'licence.accept')).toBe(true);
    expect(can(actor('reader', { emailVerified: false }), 'licence.accept')).toBe(false);
    expect(can(actor('contributor'), 'licence.accept')).toBe(false);
    expect(can(actor('admin', { disabled: true }), 'user.manage')).toBe(false);
    expect(can(actor('reader', { disabled: true }), 'account.update')).toBe(false);
  });
});
