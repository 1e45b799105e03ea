import type { AddressInfo } from 'node:net';
import { parse } from 'csv-parse/sync';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { CheckIn, Feedstock, Photo, Trial, User } from '@/db/models';
import { CHECK_IN_EXPORT_COLUMNS, TRIAL_EXPORT_COLUMNS } from '@/lib/queries/trials';
import { contributorLabel } from '@/lib/trials/contributor';
import { trialInput } from '../support/factories';
import { startNextHandler } from '../support/next-app';
import { sendRaw } from '../support/raw-http';

// The JSON API, pages and exports of trials through the real Next.js handler (the built app).
// Until sign-in lands every request is a visitor: writes answer 401 after validation and the
// same-origin check; signed-in behaviour is tested through the services (tests/services).

const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/i;

let app: Awaited<ReturnType<typeof startNextHandler>>;
let port: number;
let origin: string;
let demoTrial: Trial;


beforeAll(async () => {
  app = await startNextHandler();
  await new Promise<void>((r) => app.server.listen(0, '127.0.0.1', r));
  port = (app.server.address() as AddressInfo).port;
  origin = `http://127.0.0.1:${port}`;
  // A demo trial with photos (the demo loader gives most trials placeholder photos).
  const photo = (await Photo.findOne({ order: [['id', 'ASC']] }))!;
  demoTrial = (await Trial.findByPk(photo.trialId))!;
});

afterAll(async () => {
  await app?.close();
  await sequelize.close();
});

describe('GET /api/trials and /api/trials/:id', () => {
  it('lists trials filtered by setting and status, paginated', async () => {
    const res = await request(app.server).get('/api/trials?setting=bed&status=closed&page=1');
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(await Trial.count({ where: { setting: 'bed', status: 'closed' } }));
    expect(res.body.rows.length).toBe(Math.min(20, res.body.total));
    for (const row of res.body.rows) expect(row).toMatchObject({ setting: 'bed', status: 'closed' });
    // Bad filter values are dropped, not errors.
    const loose = await request(app.server).get('/api/trials?setting=moon&page=-3');
    expect(loose.status).toBe(200);
    expect(loose.body.total).toBe(await Trial.count());
    expect(loose.body.page).toBe(1);
  });

  it('filters by feedstock slug and by pseudonymous contributor label', async () => {
    const feedstock = (await Feedstock.findByPk(demoTrial.feedstockId))!;
    const byFeedstock = await request(app.server).get(`/api/trials?feedstock=${feedstock.slug}`);
    expect(byFeedstock.body.total).toBe(await Trial.count({ where: { feedstockId: feedstock.id } }));
    const label = contributorLabel(demoTrial.ownerId);
    const byContributor = await request(app.server).get(`/api/trials?contributor=${label}`);
    expect(byContributor.body.total).toBe(await Trial.count({ where: { ownerId: demoTrial.ownerId } }));
    for (const row of byContributor.body.rows) expect(row.contributor).toBe(label);
  });

  it('shows one trial with its check-ins, engine outcome and no account data', async () => {
    const res = await request(app.server).get(`/api/trials/${demoTrial.id}`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: demoTrial.id, status: demoTrial.status, region: demoTrial.region, contributor: contributorLabel(demoTrial.ownerId) });
    expect(res.body.checkIns.length).toBe(await CheckIn.count({ where: { trialId: demoTrial.id } }));
    expect(res.body.abilities).toEqual({ canCheckIn: false, canUpload: false, canClose: false, canEdit: false });
    const owner = (await User.findByPk(demoTrial.ownerId))!;
    const text = JSON.stringify(res.body);
    expect(text).not.toContain(owner.id);
    expect(text).not.toContain(owner.email!);
    expect(text).not.toMatch(UUID);
    expect((await request(app.server).get('/api/trials/999999999')).status).toBe(404);
    expect((await request(app.server).get('/api/trials/abc')).status).toBe(404);
  });
});

describe('writes through the route handlers', () => {
  it('answers 400 with field messages for bad input and stores nothing (validated before the session; the schema is public)', async () => {
    const before = await Trial.count();
    const feedstock = (await Feedstock.findOne())!;
    const negative = await request(app.server).post('/api/trials').set('Origin', origin).send({ ...trialInput(feedstock.id), dose: { amount: -1, unit: 'kg' } });
    expect(negative.status).toBe(400);
    expect(negative.body.error).toMatchObject({ code: 'invalid_input', fieldErrors: { 'dose.amount': ['Dose must be more than zero.'] } });
    const zeroArea = await request(app.server).post('/api/trials').set('Origin', origin).send({ ...trialInput(feedstock.id), surfaceArea: { amount: 0, unit: 'm2' } });
    expect(zeroArea.status).toBe(400);
    expect(zeroArea.body.error.fieldErrors['surfaceArea.amount']).toEqual(['Surface area must be more than zero.']);
    const notJson = await request(app.server).post('/api/trials').set('Origin', origin).set('Content-Type', 'application/json').send('{nope');
    expect(notJson.status).toBe(400);
    const checkIns = await CheckIn.count();
    const tooMuch = await request(app.server)
      .post(`/api/trials/${demoTrial.id}/check-ins`)
      .set('Origin', origin)
      .send({ observedOn: '2026-11-01', wormActivity: 'many', shareRemainingPct: 120 });
    expect(tooMuch.status).toBe(400);
    expect(tooMuch.body.error.fieldErrors.shareRemainingPct).toEqual(['Share remaining cannot be above 100%.']);
    const badClose = await request(app.server).post(`/api/trials/${demoTrial.id}/close`).set('Origin', origin).send({ status: 'finished' });
    expect(badClose.status).toBe(400);
    expect(await Trial.count()).toBe(before);
    expect(await CheckIn.count()).toBe(checkIns);
  });

  it('answers 401 to a visitor with valid input, and stores nothing', async () => {
    const before = await Trial.count();
    const feedstock = (await Feedstock.findOne())!;
    expect((await request(app.server).post('/api/trials').set('Origin', origin).send(trialInput(feedstock.id))).status).toBe(401);
    expect((await request(app.server).post(`/api/trials/${demoTrial.id}/check-ins`).send({ observedOn: '2026-11-01', wormActivity: 'many', shareRemainingPct: 20 })).status).toBe(401);
    expect((await request(app.server).post(`/api/trials/${demoTrial.id}/close`).send({})).status).toBe(401);
    expect((await request(app.server).patch(`/api/trials/${demoTrial.id}`).send({ version: demoTrial.version, notes: 'x' })).status).toBe(401);
    const photo = await Photo.findOne();
    expect((await request(app.server).delete(`/api/photos/${photo!.id}`)).status).toBe(401);
    expect(await Trial.count()).toBe(before);
  });

  it('refuses writes from a foreign Origin with 403', async () => {
    const feedstock = (await Feedstock.findOne())!;
    const evil = 'https://evil.example';
    expect((await request(app.server).post('/api/trials').set('Origin', evil).send(trialInput(feedstock.id))).status).toBe(403);
    expect((await request(app.server).post(`/api/trials/${demoTrial.id}/check-ins`).set('Origin', evil).send({})).status).toBe(403);
    expect((await request(app.server).post(`/api/trials/${demoTrial.id}/close`).set('Origin', evil).send({})).status).toBe(403);
    expect((await request(app.server).patch(`/api/trials/${demoTrial.id}`).set('Origin', evil).send({})).status).toBe(403);
    expect((await request(app.server).post(`/api/trials/${demoTrial.id}/photos`).set('Origin', evil).send(Buffer.from('x'))).status).toBe(403);
    expect((await request(app.server).delete('/api/photos/1').set('Origin', evil)).status).toBe(403);
  });

  it('refuses a 12 MB photo with 413 before reading it, and a visitor’s photo with 401', async () => {
    const big = Buffer.alloc(12 * 1024 * 1024, 0x20);
    big.set([0xff, 0xd8, 0xff, 0xe0]);
    const res = await sendRaw(port, { method: 'POST', path: `/api/trials/${demoTrial.id}/photos`, headers: { 'content-type': 'image/jpeg', origin }, body: big });
    expect(res.status).toBe(413);
    expect(JSON.parse(res.body).error.code).toBe('payload_too_large');
    const png = await sharp({ create: { width: 4, height: 4, channels: 3, background: '#000' } }).png().toBuffer();
    const before = await Photo.count();
    const anon = await request(app.server).post(`/api/trials/${demoTrial.id}/photos`).set('Origin', origin).set('Content-Type', 'image/jpeg').send(png);
    expect(anon.status).toBe(401);
    expect(await Photo.count()).toBe(before);
  });
});

describe('serving photos', () => {
  it('serves a photo and its thumbnail with their content type, nosniff and a long cache, never with metadata', async () => {
    const photo = (await Photo.findOne({ where: { trialId: demoTrial.id } })) ?? (await Photo.findOne())!;
    const full = await request(app.server).get(`/api/photos/${photo.id}`).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(full.status).toBe(200);
    expect(full.headers['content-type']).toBe(photo.contentType);
    expect(full.headers['x-content-type-options']).toBe('nosniff');
    expect(full.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    const meta = await sharp(full.body as Buffer).metadata();
    expect([meta.width, meta.height]).toEqual([photo.width, photo.height]);
    expect(meta.exif).toBeUndefined();
    const thumb = await request(app.server).get(`/api/photos/${photo.id}/thumbnail`);
    expect(thumb.status).toBe(200);
    expect(thumb.headers['content-type']).toBe('image/webp');
    expect(thumb.headers['x-content-type-options']).toBe('nosniff');
    const again = await request(app.server).get(`/api/photos/${photo.id}`).set('If-None-Match', full.headers.etag);
    expect(again.status).toBe(304);
    expect((await request(app.server).get('/api/photos/999999999')).status).toBe(404);
    expect((await request(app.server).get('/api/photos/..%2F..%2Fetc%2Fpasswd')).status).toBe(404);
  });
});

/** A JSON export value as the CSV writes it. */
const cell = (v: unknown) => (v === null || v === undefined ? '' : String(v));

describe('exports', () => {
  it('site-wide CSV parses back with a general-purpose CSV parser into the same rows as the JSON', async () => {
    const csv = await request(app.server).get('/api/export/trials.csv');
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toBe('text/csv; charset=utf-8; header=present');
    expect(csv.headers.link).toBe('<https://creativecommons.org/licenses/by-sa/4.0/>; rel="license"');
    expect(csv.headers['content-disposition']).toBe('attachment; filename="trialbed-all-trials-cc-by-sa-4.0.csv"');
    // RFC 4180 §2 rule 1 (REFERENCES.md §8): every record ends with CRLF; no bare LF outside quotes.
    expect(csv.text.endsWith('\r\n')).toBe(true);
    const rows = parse(csv.text, { columns: true, record_delimiter: '\r\n' }) as Record<string, string>[];
    const json = await request(app.server).get('/api/export/trials.json');
    expect(json.status).toBe(200);
    expect(json.headers.link).toContain('rel="license"');
    expect(json.body.licence).toEqual({ name: 'CC BY-SA 4.0', url: 'https://creativecommons.org/licenses/by-sa/4.0/' });
    expect(json.body.trials.length).toBe(await Trial.count());
    expect(Object.keys(rows[0])).toEqual([...TRIAL_EXPORT_COLUMNS]);
    expect(rows).toEqual(json.body.trials.map((t: Record<string, unknown>) => Object.fromEntries(TRIAL_EXPORT_COLUMNS.map((c) => [c, cell(t[c])]))));
  });

  it('exports check-ins too, and one feedstock on its own (?format= or .csv/.json)', async () => {
    const checkIns = await request(app.server).get('/api/export/trials.csv?table=check-ins');
    const rows = parse(checkIns.text, { columns: true, record_delimiter: '\r\n' }) as Record<string, string>[];
    expect(rows.length).toBe(await CheckIn.count());
    expect(Object.keys(rows[0])).toEqual([...CHECK_IN_EXPORT_COLUMNS]);
    const feedstock = (await Feedstock.findByPk(demoTrial.feedstockId))!;
    const one = await request(app.server).get(`/api/feedstocks/${feedstock.slug}/export.csv`);
    expect(one.headers['content-disposition']).toBe(`attachment; filename="trialbed-${feedstock.slug}-trials-cc-by-sa-4.0.csv"`);
    const oneRows = parse(one.text, { columns: true, record_delimiter: '\r\n' }) as Record<string, string>[];
    expect(oneRows.length).toBe(await Trial.count({ where: { feedstockId: feedstock.id } }));
    for (const r of oneRows) expect(r.feedstock_slug).toBe(feedstock.slug);
    const oneJson = await request(app.server).get(`/api/feedstocks/${feedstock.slug}/export?format=json`);
    expect(oneJson.body.trials.map((t: { trial_id: number }) => String(t.trial_id))).toEqual(oneRows.map((r) => r.trial_id));
    const withCheckIns = oneJson.body.trials.find((t: { trial_id: number }) => t.trial_id === demoTrial.id);
    expect(withCheckIns.check_ins.length).toBe(await CheckIn.count({ where: { trialId: demoTrial.id } }));
    expect((await request(app.server).get('/api/feedstocks/no-such-thing/export.csv')).status).toBe(404);
    const badFormat = await request(app.server).get(`/api/feedstocks/${feedstock.slug}/export?format=xml`);
    expect(badFormat.status).toBe(400);
    expect(badFormat.body.error.fieldErrors.format).toBeDefined();
  });

  it('places no one: regions only, no e-mail addresses or account ids', async () => {
    const [csv, checkIns, json] = await Promise.all([
      request(app.server).get('/api/export/trials.csv'),
      request(app.server).get('/api/export/trials.csv?table=check-ins'),
      request(app.server).get('/api/export/trials.json'),
    ]);
    const users = await User.findAll({ attributes: ['id', 'email'] });
    for (const text of [csv.text, checkIns.text, JSON.stringify(json.body)]) {
      expect(text).not.toMatch(UUID);
      for (const u of users) if (u.email) expect(text).not.toContain(u.email);
    }
  });
});

describe('trial pages', () => {
  it('render the list, a trial with its chart, and the new-trial page', async () => {
    const list = await request(app.server).get('/trials?setting=bin');
    expect(list.status).toBe(200);
    expect(list.text).toContain('Trials 1–');
    const page = await request(app.server).get(`/trials/${demoTrial.id}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain('Share of the dose remaining and worm activity by day');
    expect(page.text).toContain('role="img"');
    const fresh = await request(app.server).get('/trials/new');
    // A private page: proxy.ts sends a visitor to sign in first, and back after.
    expect(fresh.status).toBe(307);
    expect(fresh.headers.location).toContain('/signin?callbackUrl=%2Ftrials%2Fnew');
    // A missing trial shows the not-found page marked noindex. Its status is 200, not 404: the root
    // app/loading.tsx makes every page stream, and Next.js sends 200 for a streamed notFound()
    // (documented; vercel/next.js#45801). The JSON API answers a real 404 (above).
    const missing = await request(app.server).get('/trials/999999999');
    expect(missing.text).toContain('Nothing buried here');
    expect(missing.text).toMatch(/<meta name="robots" content="noindex"/);
  });
});
