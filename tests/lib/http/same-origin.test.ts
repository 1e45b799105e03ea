import { describe, expect, it } from 'vitest';
import { assertSameOrigin } from '@/lib/http/same-origin';

const req = (headers: Record<string, string>) => new Request('http://localhost:3000/api/trials', { method: 'POST', headers });

describe('same-origin check for writes', () => {
  it('lets a request from its own host through', () => {
    expect(() => assertSameOrigin(req({ host: '127.0.0.1:4100', origin: 'http://127.0.0.1:4100' }))).not.toThrow();
    expect(() => assertSameOrigin(req({ host: 'localhost:3000', origin: 'http://localhost:3000' }))).not.toThrow();
  });

  it('lets a request without Origin through (not a browser riding a session)', () => {
    expect(() => assertSameOrigin(req({ host: 'localhost:3000' }))).not.toThrow();
  });

  it('refuses a foreign Origin, "null" and a cross-site fetch without Origin', () => {
    expect(() => assertSameOrigin(req({ host: 'localhost:3000', origin: 'https://evil.example' }))).toThrow(expect.objectContaining({ status: 403 }));
    expect(() => assertSameOrigin(req({ host: 'localhost:3000', origin: 'null' }))).toThrow(expect.objectContaining({ status: 403 }));
    expect(() => assertSameOrigin(req({ host: 'localhost:3000', 'sec-fetch-site': 'cross-site' }))).toThrow(expect.objectContaining({ status: 403 }));
    // Same host name, other port: another origin.
    expect(() => assertSameOrigin(req({ host: 'localhost:3000', origin: 'http://localhost:3001' }))).toThrow(expect.objectContaining({ status: 403 }));
  });
});
