import request from 'supertest';
import { XMLParser } from 'fast-xml-parser';
import { decodeHTML } from 'entities';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { Feedstock, FeedstockRedirect } from '@/db/models';
import { DEMO_FEEDSTOCKS } from '@/db/seeders/demo-scenario';
import { startNextHandler } from '../support/next-app';
import { buildFeedstock, buildUser } from '../support/factories';
import { openSession } from '../support/sessions';
import { XSS_VECTORS, assertInertHtml } from '../support/xss';
import { UNITS_SCRIPT } from '@/lib/units-cookie';
import { asciiHtml } from '@/lib/http/ascii-html.mjs';

/** Text as React writes it into HTML. */
const html = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#x27;');

// Feedstock pages, search, index, feeds and tools through the real Next.js handler (the build `npm test` makes).
describe('feedstock pages over HTTP', () => {
  let app: Awaited<ReturnType<typeof startNextHandler>>;
  const made: Feedstock[] = [];

  beforeAll(async () => {
    app = await startNextHandler();
  });

  afterAll(async () => {
    for (const f of made) await f.destroy();
    await app?.close();
    await sequelize.close();
  });

  it('renders every demo feedstock page (200, with its name)', async () => {
    expect(DEMO_FEEDSTOCKS).toHaveLength(38);
    for (const f of DEMO_FEEDSTOCKS) {
      const res = await request(app.server).get(`/feedstocks/${f.slug}`);
      expect(res.status, f.slug).toBe(200);
      expect(res.text, f.slug).toContain(html(f.name));
      expect(res.text).toContain(`<link rel="alternate" type="application/atom+xml"`);
      expect(res.text).toContain(`href="http://localhost:3000/feedstocks/${f.slug}/feed.xml"`);
    }
  });

  it('shows handling cautions and defers to local rules where the feedstock calls for them', async () => {
    const res = await request(app.server).get('/feedstocks/horse-manure');
    expect(res.text).toContain('Handling it safely');
    expect(res.text).toContain('Follow your local regulations and get licensed advice where it applies.');
    const plain = await request(app.server).get('/feedstocks/banana-peel');
    expect(plain.text).not.toContain('Handling it safely');
  });

  it('puts every load in both units into the one cached page; the browser shows the reader’s', async () => {
    // Orange peel's published bin ceiling is 1.5 kg/m² (demo scenario) = 0.307 lb/ft² (1 lb = 0.45359237 kg, 1 ft² = 0.09290304 m², NIST SP 811).
    // Pages come from the page cache in ASCII form ("m&#xb2;"): decode character references before comparing text.
    const metric = await request(app.server).get('/feedstocks/orange-peel');
    expect(decodeHTML(metric.text)).toContain('<span class="units-metric">1.5 kg/m²</span><span class="units-imperial">0.31 lb/ft²</span>');
    // The units cookie is read in the browser (the root layout's script sets <html data-units>), never on the server.
    expect(metric.text).toMatch(/document\.documentElement\.dataset\.units=/);
    const imperial = await request(app.server).get('/feedstocks/orange-peel').set('Cookie', 'units=imperial');
    expect(imperial.headers['x-nextjs-cache']).toBe('HIT');
    expect(decodeHTML(imperial.text)).toContain('0.31 lb/ft²');
  });

  it('keeps a cached page in ASCII form: the same document, written without transcoding', async () => {
    const f = await buildFeedstock({ name: 'Test café rinds — dried' });
    made.push(f);
    await f.update({ summary: 'Dried café rinds: 0.5–1.0 kg/m² a week, “slowly” 🪱.' });
    const fresh = await request(app.server).get(`/feedstocks/${f.slug}`);
    expect(fresh.headers['x-nextjs-cache']).toBe('MISS');
    expect(fresh.text).toContain('Dried café rinds: 0.5–1.0 kg/m² a week, “slowly” 🪱.');
    // Uncompressed, as the benchmark asks for it, so Content-Length is the page's own.
    const cached = await request(app.server).get(`/feedstocks/${f.slug}`).set('Accept-Encoding', 'identity');
    expect(cached.headers['x-nextjs-cache']).toBe('HIT');
    const bytes = Buffer.from(cached.text, 'utf8');
    expect(bytes.every((b) => b < 0x80)).toBe(true);
    expect(Number(cached.headers['content-length'])).toBe(bytes.length);
    // The cache handler (lib/http/page-cache-handler.mjs) stores exactly the render in escaped form; that the escaped
    // form parses to the same document is checked in Chromium by tests/lib/http/ascii-html.test.ts.
    expect(cached.text).toBe(asciiHtml(fresh.text));
    expect(decodeHTML(cached.text)).toContain('Dried café rinds: 0.5–1.0 kg/m² a week, “slowly” 🪱.');
  });

  it('serves the feedstock page from the page cache and drops it when an editor publishes', async () => {
    // Left in the throwaway database: its published revision refers to it.
    const f = await buildFeedstock({ name: 'Test cached page' });
    const first = await request(app.server).get(`/feedstocks/${f.slug}`);
    expect(first.status).toBe(200);
    const again = await request(app.server).get(`/feedstocks/${f.slug}`);
    expect(again.headers['x-nextjs-cache']).toBe('HIT');
    expect(again.text).not.toContain('Freshly published text');
    const editor = await buildUser({ role: 'editor' });
    const { cookie } = await openSession(editor);
    const edit = await request(app.server)
      .post(`/api/feedstocks/${f.slug}/revisions`)
      .set('Cookie', cookie)
      .send({ body: 'Freshly published text.', baseVersion: f.version });
    expect(edit.status).toBe(201);
    expect(edit.body.status).toBe('published');
    const after = await request(app.server).get(`/feedstocks/${f.slug}`);
    expect(after.headers['x-nextjs-cache']).not.toBe('HIT');
    expect(after.text).toContain('Freshly published text.');
  });

  it('answers 308 for an old address and a merged feedstock, 404 for an unknown one', async () => {
    const target = await buildFeedstock({ name: 'Test redirect target' });
    const merged = await buildFeedstock({ name: 'Test merged source' });
    made.push(merged, target);
    await merged.update({ mergedIntoId: target.id });
    await FeedstockRedirect.create({ oldSlug: `${target.slug}-old`, feedstockId: target.id });

    const old = await request(app.server).get(`/feedstocks/${target.slug}-old`).redirects(0);
    expect(old.status).toBe(308);
    expect(old.headers.location).toMatch(new RegExp(`/feedstocks/${target.slug}$`));
    const m = await request(app.server).get(`/feedstocks/${merged.slug}`).redirects(0);
    expect(m.status).toBe(308);
    expect(m.headers.location).toMatch(new RegExp(`/feedstocks/${target.slug}$`));
    const sub = await request(app.server).get(`/feedstocks/${merged.slug}/history`).redirects(0);
    expect(sub.status).toBe(308);
    const missing = await request(app.server).get('/feedstocks/no-such-feedstock-here');
    expect(missing.status).toBe(404);
  });

  it('renders stored-XSS vectors in page text inert in the real page HTML', async () => {
    const f = await buildFeedstock({ name: 'Test XSS page' });
    made.push(f);
    await f.update({ pageText: XSS_VECTORS.join('\n\n') + '\n\nThe end of the page text.' });
    const res = await request(app.server).get(`/feedstocks/${f.slug}`);
    expect(res.status).toBe(200);
    const start = res.text.indexOf('data-user-text-start');
    const end = res.text.indexOf('data-user-text-end');
    expect(start).toBeGreaterThan(0);
    expect(end).toBeGreaterThan(start);
    const region = res.text.slice(res.text.indexOf('>', start) + 1, res.text.lastIndexOf('<', end));
    expect(region).toContain('The end of the page text.');
    assertInertHtml(region);
    // Outside the region too: every script on the page is one Next.js itself emits.
    for (const m of res.text.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)) {
      const [, attrs, body] = m;
      const b = body.trim();
      const ok =
        (/\bsrc="\/_next\//.test(attrs) && b === '') ||
        /^\(?self\.__next_f/.test(b) || // React Server Component payload (text inside is JSON-escaped)
        (/\bid="_R_"/.test(attrs) && /^\(globalThis\["TURBOPACK"\]/.test(b)) || // Turbopack's chunk loader
        body === UNITS_SCRIPT; // ours: the units cookie to <html data-units> (lib/units-cookie.ts)
      expect(ok, `unexpected script: ${m[0].slice(0, 200)}`).toBe(true);
      expect(body).not.toMatch(/<\/?(script|img|svg|iframe)/i);
    }
    expect(res.text).not.toMatch(/<(iframe|object|embed|svg[^>]*onload|img[^>]*onerror)/i);
  });

  it('answers the search API with verdicts, and rejects bad queries with field messages', async () => {
    const ok = await request(app.server).get('/api/search').query({ q: 'can worms eat orange peels?' });
    expect(ok.status).toBe(200);
    expect(ok.body.terms).toEqual(['orange', 'peel']);
    expect(ok.body.results[0]).toMatchObject({ slug: 'orange-peel', name: 'Orange peel', published: { bin: 'limit', bed: 'avoid' } });
    const none = await request(app.server).get('/api/search').query({ q: 'kombucha scoby' });
    expect(none.body.results).toEqual([]);
    const empty = await request(app.server).get('/api/search');
    expect(empty.status).toBe(200);
    expect(empty.body.results).toEqual([]);
    const long = await request(app.server).get('/api/search').query({ q: 'x'.repeat(121) });
    expect(long.status).toBe(400);
    expect(long.body.error.fieldErrors.q[0]).toContain('120');
    const limit = await request(app.server).get('/api/search').query({ q: 'peel', limit: 'lots' });
    expect(limit.status).toBe(400);
    expect(limit.body.error.fieldErrors.limit).toBeDefined();
  });

  it('rebuilds the search index when feedstocks change (version check)', async () => {
    const before = await request(app.server).get('/api/search').query({ q: 'quillwort fronds' });
    expect(before.body.results).toEqual([]);
    const f = await buildFeedstock({ name: 'Quillwort fronds' });
    made.push(f);
    // The index checks the data version at most once a second.
    await new Promise((r) => setTimeout(r, 1_100));
    const after = await request(app.server).get('/api/search').query({ q: 'can worms eat quillwort frond?' });
    expect(after.body.results[0]).toMatchObject({ slug: f.slug, name: 'Quillwort fronds' });
  });

  it('sorts, filters and paginates the index from the URL, ignoring bad values', async () => {
    const manure = await request(app.server).get('/feedstocks').query({ category: 'manure' });
    expect(manure.status).toBe(200);
    expect(manure.text).toContain('Horse manure');
    expect(manure.text).not.toContain('>Banana peel<');
    const avoidInBeds = await request(app.server).get('/feedstocks').query({ verdict: 'avoid', setting: 'bed' });
    expect(avoidInBeds.text).toContain('Orange peel'); // published "Keep out" in open beds (demo scenario)
    expect(avoidInBeds.text).not.toContain('>Banana peel<');
    const paged = await request(app.server).get('/feedstocks').query({ per: '25', page: '2', sort: 'name' });
    expect(paged.text).toMatch(/Showing 26–\d+ of \d+ feedstocks/);
    const desc = await request(app.server).get('/feedstocks').query({ sort: 'trials', dir: 'desc' });
    expect(desc.text).toContain('aria-sort="descending"');
    const bogus = await request(app.server).get('/feedstocks').query({ sort: 'nonsense', page: '-4', category: 'rocks' });
    expect(bogus.status).toBe(200);
    expect(bogus.text).toMatch(/Showing 1–\d+ of \d+ feedstocks/);
  });

  it('serves a valid Atom feed per feedstock and a sitemap', async () => {
    const res = await request(app.server).get('/feedstocks/orange-peel/feed.xml');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('application/atom+xml');
    const doc = new XMLParser({ ignoreAttributes: false }).parse(res.text);
    // RFC 4287 §4.1.1: exactly one id, title and updated; an author; entries each with id, title, updated and a link.
    expect(doc.feed['@_xmlns']).toBe('http://www.w3.org/2005/Atom');
    for (const k of ['id', 'title', 'updated', 'author']) expect(doc.feed[k], k).toBeDefined();
    const entries = [doc.feed.entry].flat();
    expect(entries.length).toBeGreaterThan(3);
    for (const e of entries) {
      expect(e.id).toMatch(/^http:\/\/localhost:3000\//);
      expect(e.title).toBeTruthy();
      expect(Date.parse(e.updated)).not.toBeNaN();
      expect(e.link['@_href']).toMatch(/^http:\/\/localhost:3000\//);
    }
    const sitemap = await request(app.server).get('/sitemap.xml');
    expect(sitemap.status).toBe(200);
    expect(sitemap.text).toContain('/feedstocks/orange-peel</loc>');
    expect(sitemap.text).toContain('/guides/reading-a-verdict</loc>');
    const robots = await request(app.server).get('/robots.txt');
    expect(robots.text).toContain('Sitemap: http://localhost:3000/sitemap.xml');
  });

  it('takes page edits as JSON only from signed-in contributors, with clear 4xx answers', async () => {
    const edit = { body: 'New text.', baseVersion: 1 };
    const anon = await request(app.server).post('/api/feedstocks/orange-peel/revisions').send(edit);
    expect(anon.status).toBe(401);
    expect(anon.body.error.code).toBe('unauthenticated');
    const missing = await request(app.server).post('/api/feedstocks/no-such-feedstock-here/revisions').send(edit);
    expect(missing.status).toBe(404);
    const notJson = await request(app.server).post('/api/feedstocks/orange-peel/revisions').set('Content-Type', 'application/json').send('{nope');
    expect(notJson.status).toBe(400);
    const formPost = await request(app.server).post('/api/feedstocks/orange-peel/revisions').type('form').send({ body: 'x', baseVersion: '1' });
    expect(formPost.status).toBe(400);
    expect((await request(app.server).get('/feedstocks/orange-peel')).text).not.toContain('New text.');
  });

  it('renders the guides, the tools and the edit page for a visitor', async () => {
    for (const slug of ['starting-a-worm-bin', 'running-a-feeding-trial', 'reading-a-verdict', 'handling-safely']) {
      const g = await request(app.server).get(`/guides/${slug}`);
      expect(g.status, slug).toBe(200);
      expect(g.text).toContain('Sources');
    }
    expect((await request(app.server).get('/guides/no-such-guide')).status).toBe(404);
    // REFERENCES §2, example 2d (derived): 10 kg cattle manure + 1 kg newspaper → C:N 31.88, moisture 74.09%.
    const mix = await request(app.server).get('/tools/mix').query({ m1: 'ref:cattle-manure', q1: '10', m2: 'ref:newspaper', q2: '1' });
    expect(mix.text).toContain('31.9<!-- -->:1');
    expect(mix.text).toContain('74.1<!-- -->%');
    const badMix = await request(app.server).get('/tools/mix').query({ m1: 'ref:cattle-manure', q1: 'ten' });
    expect(badMix.status).toBe(200);
    expect(badMix.text).toContain('Amount must be a number.');
    // NC State AG-473-18: 3.5 lb of scraps a week → 3.5 ft², a 2 × 2 ft box.
    const bin = await request(app.server).get('/tools/bin-size').query({ scraps: '3.5', unit: 'lb', temp: '35' });
    expect(bin.text).toContain('3.5<!-- --> ft²');
    expect(bin.text).toMatch(/2<!-- --> × <!-- -->2<!-- --> ft/);
    // Loehr, Neuhauser & Malecki 1985: E. fetida dies at 35 °C.
    expect(bin.text).toContain('Dangerous: worms die here');
    // Private pages send a visitor to sign in first (proxy.ts), and come back after.
    const edit = await request(app.server).get('/feedstocks/orange-peel/edit');
    expect(edit.status).toBe(307);
    expect(edit.headers.location).toContain('/signin?callbackUrl=%2Ffeedstocks%2Forange-peel%2Fedit');
    const review = await request(app.server).get('/review/edits');
    expect(review.status).toBe(307);
    expect(review.headers.location).toContain('/signin');
  });
});
