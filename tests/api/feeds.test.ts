import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { Feedstock, FeedstockRedirect, FeedstockRevision, PublishedVerdict, User } from '@/db/models';
import { createProposal, decideProposal } from '@/lib/services/proposals';
import { createTrial } from '@/lib/services/trials';
import { parseAtom, validateAtom } from '../support/atom';
import { buildFeedstock, buildUser, trialInput } from '../support/factories';
import { actorOf, cleanUpMailFixtures } from '../support/mail';
import { startNextHandler } from '../support/next-app';

const DAY = 86_400_000;
const ATOM_NS = 'http://www.w3.org/2005/Atom';

// Atom feeds (RFC 4287) for a feedstock and for the site, through the real
// Next.js handler, parsed with a general-purpose XML parser (fast-xml-parser)
// and checked against the element rules of RFC 4287 §4.1.1–4.1.2 (REFERENCES §8, V2).
describe('Atom feeds (RFC 4287)', () => {
  let app: Awaited<ReturnType<typeof startNextHandler>>;
  let f: Feedstock;
  let author: User;
  let moderator: User;
  let proposalId: number;
  let trialId: number;
  const base = () => (process.env.AUTH_URL ?? 'http://localhost:3000').replace(/\/$/, '');

  beforeAll(async () => {
    app = await startNextHandler();
    author = await buildUser({ role: 'contributor', name: 'Feed Test Author', createdAt: new Date(Date.now() - 30 * DAY) });
    moderator = await buildUser({ role: 'moderator', createdAt: new Date(Date.now() - 30 * DAY) });
    f = await buildFeedstock({ name: 'Feed test peel & pith' });
    await PublishedVerdict.create({ feedstockId: f.id, setting: 'bed', verdict: 'avoid', ceilingKgM2: null, cautions: [], proposalId: null, publishedAt: new Date() });
    // One of each event: a trial linked, a proposal opened and decided, a page edit.
    const trial = await createTrial(
      actorOf(author),
      trialInput(f.id, {
        setting: 'bed',
        preparation: 'chopped',
        surfaceArea: { amount: 1, unit: 'm2' },
        dose: { amount: 3, unit: 'kg' },
        region: 'Hollow Creek county',
        startDate: '2026-01-10',
        notes: 'Next to the shed at 12 Orchard Lane.',
      }),
    );
    trialId = trial.id;
    ({ id: proposalId } = await createProposal(actorOf(author), {
      feedstockId: f.id,
      settings: [{ setting: 'bed', verdict: 'limit', ceilingKgM2: 3, cautions: [] }],
      rationale: 'Chopped peel at 3 kg/m² went in three weeks.',
      trialIds: [trial.id],
    }));
    await decideProposal(actorOf(moderator), proposalId, { decision: 'approve', note: 'The trial supports it.' });
    await FeedstockRevision.create({
      feedstockId: f.id,
      authorId: author.id,
      body: 'New page text.',
      editSummary: 'Added the pith <note>',
      status: 'published',
      baseVersion: 1,
      reviewedAt: new Date(),
    });
  });

  afterAll(async () => {
    await app?.close();
    await FeedstockRedirect.destroy({ where: { feedstockId: f.id } });
    await FeedstockRevision.destroy({ where: { feedstockId: f.id } });
    await sequelize.query('DELETE FROM evidence_aggregates WHERE feedstock_id = ?', { replacements: [f.id] });
    await sequelize.query('DELETE FROM evidence_verdicts WHERE feedstock_id = ?', { replacements: [f.id] });
    await cleanUpMailFixtures({ feedstocks: [f] });
    await sequelize.query('DELETE FROM audit_log WHERE actor_id IN (?)', { replacements: [[author.id, moderator.id]] });
    await User.destroy({ where: { id: [author.id, moderator.id] } });
    await sequelize.close();
  });

  it('serves the feedstock feed as valid Atom with every kind of event', async () => {
    const res = await request(app.server).get(`/feedstocks/${f.slug}/feed.xml`);
    expect(res.status).toBe(200);
    // RFC 4287 §7: the media type application/atom+xml.
    expect(res.headers['content-type']).toBe('application/atom+xml; charset=utf-8');
    expect(validateAtom(res.text)).toEqual([]);
    const { feed } = parseAtom(res.text);
    expect((feed as Record<string, unknown>)['@_xmlns']).toBe(ATOM_NS);
    const entries = feed.entry as Record<string, unknown[]>[];
    const titles = entries.map((e) => String(e.title[0] && typeof e.title[0] === 'object' ? (e.title[0] as { '#text': string })['#text'] : e.title[0]));
    expect(titles).toEqual(
      expect.arrayContaining([
        `Verdict decided for ${f.name.replace('&', '&amp;')}: Keep out → Small amounts only in open beds`,
        `Proposal ${proposalId} opened for ${f.name.replace('&', '&amp;')}: Small amounts only in open beds`,
        `New trial of ${f.name.replace('&', '&amp;')} in an open bed (chopped)`,
        `Page of ${f.name.replace('&', '&amp;')} edited: Added the pith &lt;note&gt;`,
      ]),
    );
    // Absolute links (the feed package wants them; RFC 4287 ids are IRIs), based on AUTH_URL.
    const hrefs = entries.map((e) => (e.link[0] as { '@_href': string })['@_href']);
    expect(hrefs).toEqual(expect.arrayContaining([`${base()}/proposals/${proposalId}`, `${base()}/trials/${trialId}`, `${base()}/feedstocks/${f.slug}/history`]));
    expect((feed.link as { '@_rel': string; '@_href': string }[]).find((l) => l['@_rel'] === 'self')!['@_href']).toBe(`${base()}/feedstocks/${f.slug}/feed.xml`);
  });

  it('serves the site feed as valid Atom that includes this feedstock', async () => {
    const res = await request(app.server).get('/feed.xml');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/atom+xml; charset=utf-8');
    expect(validateAtom(res.text)).toEqual([]);
    expect(res.text).toContain(`${base()}/proposals/${proposalId}#proposal-${proposalId}-decided`);
    expect(parseAtom(res.text).feed.entry!.length).toBeLessThanOrEqual(50);
  });

  it('places nobody: no addresses, names, regions or notes in either feed', async () => {
    for (const path of [`/feedstocks/${f.slug}/feed.xml`, '/feed.xml']) {
      const xml = (await request(app.server).get(path)).text;
      expect(xml).not.toMatch(/[A-Za-z0-9._%+-]+@[A-Za-z0-9.-]+\.[a-z]{2,}/);
      for (const secret of ['Hollow Creek', 'Orchard Lane', 'Feed Test Author', author.email!, moderator.email!]) expect(xml).not.toContain(secret);
    }
  });

  it('redirects an old slug to the current feed and answers 404 for an unknown one', async () => {
    await FeedstockRedirect.create({ oldSlug: `${f.slug}-old`, feedstockId: f.id });
    const moved = await request(app.server).get(`/feedstocks/${f.slug}-old/feed.xml`);
    expect(moved.status).toBe(308);
    expect(moved.headers.location).toBe(`${base()}/feedstocks/${f.slug}/feed.xml`);
    expect((await request(app.server).get('/feedstocks/no-such-feedstock-here/feed.xml')).status).toBe(404);
  });

  it('has a validator that rejects a feed without <updated> and an entry with neither content nor an alternate link', () => {
    const ok = `<?xml version="1.0" encoding="utf-8"?>
<feed xmlns="${ATOM_NS}"><id>https://t.example/feed.xml</id><title>T</title><updated>2026-12-01T10:00:00Z</updated>
<author><name>T</name></author><link rel="self" href="https://t.example/feed.xml"/>
<entry><id>https://t.example/1</id><title>One</title><updated>2026-12-01T10:00:00Z</updated><link href="https://t.example/1"/></entry></feed>`;
    expect(validateAtom(ok)).toEqual([]);
    // REFERENCES §8 test: a validator must reject a feed without <updated> …
    expect(validateAtom(ok.replace('<updated>2026-12-01T10:00:00Z</updated>\n', '\n'))).toContain('feed: needs exactly one <updated> (has 0)');
    // … and an entry with neither content nor an alternate link (RFC 4287 §4.1.2).
    expect(validateAtom(ok.replace('<link href="https://t.example/1"/>', ''))).toContain('entry 1: has neither <content> nor an alternate link');
    expect(validateAtom(ok.replace('<link href="https://t.example/1"/>', '<link rel="related" href="https://t.example/1"/>'))).toContain(
      'entry 1: has neither <content> nor an alternate link',
    );
    // Entries: exactly one id; feed: an author unless every entry has one.
    expect(validateAtom(ok.replace('<id>https://t.example/1</id>', ''))).toContain('entry 1: needs exactly one <id> (has 0)');
    expect(validateAtom(ok.replace('<author><name>T</name></author>', ''))).toContain('feed: needs an <author> (or one in every entry)');
    expect(validateAtom(ok.replace('2026-12-01T10:00:00Z</updated>\n<author>', 'yesterday</updated>\n<author>'))).toContain('feed: <updated> is not an RFC 3339 date-time');
  });
});
