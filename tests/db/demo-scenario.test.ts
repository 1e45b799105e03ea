/**
 * Integrity of the invented demo scenario (pure data; no database).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import {
  DEMO_ACCOUNTS,
  DEMO_CAUTION_CODES,
  DEMO_FEEDSTOCKS,
  DEMO_PEOPLE,
  DEMO_PROPOSALS,
  DEMO_REQUESTS,
  DEMO_SITES,
  DEMO_TODAY,
  DEMO_TRIALS,
  demoDoseKg,
  type Category,
  type DemoCheckIn,
  type DemoTrial,
  type Role,
  type Setting,
} from '@/db/seeders/demo-scenario';

/** The module's source without comments (the header comment may name what it avoids). */
const SOURCE = readFileSync(path.resolve(__dirname, '../../db/seeders/demo-scenario.ts'), 'utf8')
  .replace(/\/\*[\s\S]*?\*\//g, '')
  .replace(/^\s*\/\/.*$/gm, '');

const ROLES: Role[] = ['reader', 'contributor', 'editor', 'moderator', 'admin'];
const CONTRIBUTOR_OR_ABOVE: Role[] = ['contributor', 'editor', 'moderator', 'admin'];
const CATEGORIES: Category[] = ['fruit', 'vegetable', 'grain-starch', 'paper-card', 'garden', 'manure', 'animal-product', 'other'];
const SETTINGS: Setting[] = ['bin', 'flow-through', 'bed'];

const person = (key: string) => DEMO_PEOPLE.find((p) => p.key === key);
const feedstock = (slug: string) => DEMO_FEEDSTOCKS.find((f) => f.slug === slug);
const trial = (key: string) => DEMO_TRIALS.find((t) => t.key === key);

const dayNumber = (d: string) => Date.UTC(Number(d.slice(0, 4)), Number(d.slice(5, 7)) - 1, Number(d.slice(8, 10))) / 86_400_000;
const daysAfterStart = (t: DemoTrial, c: DemoCheckIn) => dayNumber(c.date) - dayNumber(t.startDate);
const doseKg = (t: DemoTrial) => demoDoseKg(t.dose.amount, t.dose.unit, feedstock(t.feedstockSlug)!.bulkDensityKgM3);
const loadKgM2 = (t: DemoTrial) => doseKg(t) / t.surfaceAreaM2;
const last = <T>(xs: T[]) => xs[xs.length - 1];

/** Every string value in a nested structure. */
function strings(value: unknown): string[] {
  if (typeof value === 'string') return [value];
  if (Array.isArray(value)) return value.flatMap(strings);
  if (value && typeof value === 'object') return Object.values(value).flatMap(strings);
  return [];
}

describe('demo scenario: module hygiene', () => {
  it('is a pure module: no imports, no clock, no Math.random', () => {
    expect(SOURCE).not.toMatch(/^\s*import\s/m);
    expect(SOURCE).not.toMatch(/require\(/);
    expect(SOURCE).not.toMatch(/Math\.random/);
    expect(SOURCE).not.toMatch(/Date\.now/);
    expect(SOURCE).not.toMatch(/new Date\(/);
  });

  it('is deterministic: importing twice gives deep-equal data', async () => {
    vi.resetModules();
    const a = await import('@/db/seeders/demo-scenario');
    vi.resetModules();
    const b = await import('@/db/seeders/demo-scenario');
    expect(a.DEMO_TRIALS).not.toBe(b.DEMO_TRIALS);
    expect(a.DEMO_TRIALS).toEqual(b.DEMO_TRIALS);
    expect(a.DEMO_FEEDSTOCKS).toEqual(b.DEMO_FEEDSTOCKS);
    expect(a.DEMO_PEOPLE).toEqual(b.DEMO_PEOPLE);
    expect(a.DEMO_SITES).toEqual(b.DEMO_SITES);
    expect(a.DEMO_PROPOSALS).toEqual(b.DEMO_PROPOSALS);
    expect(a.DEMO_REQUESTS).toEqual(b.DEMO_REQUESTS);
    expect(a.DEMO_ACCOUNTS).toEqual(b.DEMO_ACCOUNTS);
    expect(a.DEMO_TRIALS).toEqual(DEMO_TRIALS);
  });

  it('never uses the word "seed" in any content string', () => {
    const all = strings([DEMO_PEOPLE, DEMO_SITES, DEMO_FEEDSTOCKS, DEMO_TRIALS, DEMO_PROPOSALS, DEMO_REQUESTS]);
    expect(all.filter((s) => /seed/i.test(s))).toEqual([]);
  });
});

describe('demo scenario: people and sites', () => {
  it('has 10–14 people with unique keys', () => {
    expect(DEMO_PEOPLE.length).toBeGreaterThanOrEqual(10);
    expect(DEMO_PEOPLE.length).toBeLessThanOrEqual(14);
    expect(new Set(DEMO_PEOPLE.map((p) => p.key)).size).toBe(DEMO_PEOPLE.length);
  });

  it('has one demo account per role, with that role', () => {
    for (const role of ROLES) {
      const key = DEMO_ACCOUNTS[role];
      expect(key, role).toBeTruthy();
      expect(person(key)?.role, role).toBe(role);
    }
    expect(Object.keys(DEMO_ACCOUNTS).sort()).toEqual([...ROLES].sort());
  });

  it('uses unique e-mails on reserved example.* domains only', () => {
    const emails = DEMO_PEOPLE.map((p) => p.email.toLowerCase());
    expect(new Set(emails).size).toBe(emails.length);
    for (const e of emails) expect(e).toMatch(/^[a-z0-9._-]+@example\.(org|net|com)$/);
  });

  it('stores no street-address-like text in any person or site field', () => {
    const address = /\d+\s*(street|st|road|rd|ave)\b/i;
    for (const p of DEMO_PEOPLE) for (const s of strings(p)) expect(s, p.key).not.toMatch(address);
    for (const site of DEMO_SITES) for (const s of strings(site)) expect(s, site.key).not.toMatch(address);
  });

  it('records join times as ISO 8601 with an offset', () => {
    for (const p of DEMO_PEOPLE) expect(p.joinedAt, p.key).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}[+-]\d{2}:\d{2}$/);
  });

  it('has the network: community gardens, a school, an allotment site and homes', () => {
    const kinds = DEMO_SITES.map((s) => s.kind);
    expect(kinds.filter((k) => k === 'community-garden').length).toBeGreaterThanOrEqual(5);
    for (const k of ['school', 'allotment', 'home'] as const) expect(kinds).toContain(k);
    expect(new Set(DEMO_SITES.map((s) => s.key)).size).toBe(DEMO_SITES.length);
  });
});

describe('demo scenario: feedstocks', () => {
  it('has at least 30 feedstocks with unique slugs covering every category', () => {
    expect(DEMO_FEEDSTOCKS.length).toBeGreaterThanOrEqual(30);
    expect(new Set(DEMO_FEEDSTOCKS.map((f) => f.slug)).size).toBe(DEMO_FEEDSTOCKS.length);
    for (const f of DEMO_FEEDSTOCKS) expect(f.slug).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
    const categories = new Set(DEMO_FEEDSTOCKS.map((f) => f.category));
    for (const c of CATEGORIES) expect(categories.has(c), c).toBe(true);
  });

  it('has lowercase aliases, unique across feedstocks and never another feedstock’s slug or name', () => {
    const seen = new Map<string, string>();
    for (const f of DEMO_FEEDSTOCKS) {
      for (const a of f.aliases) {
        expect(a, f.slug).toBe(a.toLowerCase());
        expect(seen.has(a), `${a} on ${f.slug} and ${seen.get(a)}`).toBe(false);
        seen.set(a, f.slug);
        expect(a, f.slug).not.toBe(f.name.toLowerCase());
        for (const other of DEMO_FEEDSTOCKS) {
          if (other.slug === f.slug) continue;
          expect(a, `${f.slug} alias vs ${other.slug}`).not.toBe(other.slug);
          expect(a, `${f.slug} alias vs ${other.slug}`).not.toBe(other.name.toLowerCase());
        }
      }
    }
  });

  it('fits the database columns and page-text shape', () => {
    for (const f of DEMO_FEEDSTOCKS) {
      expect(f.slug.length, f.slug).toBeLessThanOrEqual(120);
      expect(f.name.length, f.slug).toBeLessThanOrEqual(160);
      expect(f.family.length, f.slug).toBeLessThanOrEqual(80);
      expect(f.family, f.slug).toBe(f.family.toLowerCase());
      expect(f.referenceSource.length, f.slug).toBeLessThanOrEqual(300);
      expect(f.referenceSource.length, f.slug).toBeGreaterThan(10);
      expect(f.summary.length, f.slug).toBeLessThanOrEqual(500);
      const paragraphs = f.pageText.split('\n\n');
      expect(paragraphs.length, f.slug).toBeGreaterThanOrEqual(2);
      expect(paragraphs.length, f.slug).toBeLessThanOrEqual(5);
      for (const a of f.aliases) expect(a.length).toBeLessThanOrEqual(160);
    }
  });

  it('names a source for reference values and marks the rest as common practice', () => {
    for (const f of DEMO_FEEDSTOCKS) {
      const hasValues = [f.cnRatio, f.nitrogenPct, f.moisturePct, f.bulkDensityKgM3].some((v) => v !== null);
      if (!hasValues) continue;
      expect(f.referenceSource, f.slug).toMatch(/Common practice|NRAES|Bertrand|EPA|OACC|Table/);
    }
  });

  it('carries handling cautions on manures, dusty, shredded and rodent-drawing material', () => {
    for (const f of DEMO_FEEDSTOCKS.filter((x) => x.category === 'manure')) {
      expect(f.handlingCautions, f.slug).toEqual(expect.arrayContaining(['manure', 'pathogens']));
    }
    for (const slug of ['sawdust-untreated', 'peat-moss', 'dry-leaves']) expect(feedstock(slug)!.handlingCautions, slug).toContain('dust');
    expect(feedstock('shredded-prunings')!.handlingCautions).toContain('shredder');
    for (const slug of ['fish-scraps', 'cheese']) expect(feedstock(slug)!.handlingCautions, slug).toContain('rodents');
    for (const slug of ['bread', 'cooked-rice']) expect(feedstock(slug)!.handlingCautions, slug).toContain('mould');
  });

  it('publishes at most one verdict per setting, with coherent ceilings and known caution codes', () => {
    const codes = new Set<string>(DEMO_CAUTION_CODES);
    for (const f of DEMO_FEEDSTOCKS) {
      expect(f.published.length, f.slug).toBeGreaterThan(0);
      expect(new Set(f.published.map((p) => p.setting)).size, f.slug).toBe(f.published.length);
      for (const p of f.published) {
        if (p.verdict === 'limit') expect(p.ceilingKgM2, f.slug).toBeGreaterThan(0);
        if (p.verdict === 'avoid' || p.verdict === 'unsettled') expect(p.ceilingKgM2, f.slug).toBeNull();
        for (const c of p.cautions) expect(codes.has(c), `${f.slug}: ${c}`).toBe(true);
      }
    }
  });

  it('keeps pet waste as a Keep out page with no trials', () => {
    const pet = feedstock('pet-waste')!;
    expect(pet.published.every((p) => p.verdict === 'avoid')).toBe(true);
    expect(DEMO_TRIALS.filter((t) => t.feedstockSlug === 'pet-waste')).toEqual([]);
  });
});

describe('demo scenario: reference values match REFERENCES.md', () => {
  // kg/m³ per lb/US gal and per lb/yd³ from the exact NIST constants (REFERENCES §5).
  const LB_GAL = 0.45359237 / 0.003785411784;
  const LB_YD3 = 0.45359237 / 0.764554857984;

  it('cardboard: C:N 563 (NRAES-54 Table A.1, from memory) or 560 (Bertrand/MS&T, V2); 0.1 %N; 8% moisture', () => {
    // REFERENCES §1a and §1b.
    const f = feedstock('cardboard')!;
    expect([560, 563]).toContain(f.cnRatio);
    expect(f.nitrogenPct).toBe(0.1);
    expect(f.moisturePct).toBe(8);
    // REFERENCES §4: US EPA Volume-to-Weight Conversion Factors (2016), cardboard 106 lb/yd³ (V).
    expect(f.bulkDensityKgM3).toBeCloseTo(106 * LB_YD3, 1);
  });

  it('coffee grounds: C:N 20, 2 %N, 80% moisture, 7 lb/gal (Bertrand/MS&T table, V2)', () => {
    // REFERENCES §1a.
    const f = feedstock('coffee-grounds')!;
    expect(f.cnRatio).toBe(20);
    expect(f.nitrogenPct).toBe(2);
    expect(f.moisturePct).toBe(80);
    expect(f.bulkDensityKgM3).toBeCloseTo(7 * LB_GAL, 1);
  });

  it('cattle manure: C:N 19, 2.4 %N, 81% moisture (Bertrand/MS&T, V2; Cornell/Richard spreadsheet 45.6 %C, V2)', () => {
    // REFERENCES §1a: %C = %N × C:N = 2.4 × 19 = 45.6, the Cornell spreadsheet row.
    const f = feedstock('cattle-manure')!;
    expect(f.cnRatio).toBe(19);
    expect(f.nitrogenPct).toBe(2.4);
    expect(f.moisturePct).toBe(81);
    expect(f.nitrogenPct! * f.cnRatio!).toBeCloseTo(45.6, 2);
    expect(f.bulkDensityKgM3).toBeCloseTo(7.2 * LB_GAL, 1);
  });

  it('newspaper: 5% moisture, C:N 650, 0.1 %N, 0.25 lb/gal (Bertrand/MS&T, V2)', () => {
    // REFERENCES §1a.
    const f = feedstock('shredded-newspaper')!;
    expect(f.moisturePct).toBe(5);
    expect(f.cnRatio).toBe(650);
    expect(f.nitrogenPct).toBe(0.1);
    expect(f.bulkDensityKgM3).toBeCloseTo(0.25 * LB_GAL, 1);
  });

  it('other §1a rows: sawdust, straw, leaves, horse manure, grass clippings (Bertrand/MS&T, V2)', () => {
    // REFERENCES §1a: [slug, %N, C:N, moisture %, lb/gal].
    const rows: [string, number, number, number, number][] = [
      ['sawdust-untreated', 0.2, 440, 39, 2],
      ['straw', 0.7, 80, 12, 1],
      ['dry-leaves', 0.9, 54, 38, 1],
      ['horse-manure', 1.6, 30, 72, 6.8],
      ['grass-clippings', 4, 17, 82, 1.7],
    ];
    for (const [slug, n, cn, moisture, lbGal] of rows) {
      const f = feedstock(slug)!;
      expect(f.nitrogenPct, slug).toBe(n);
      expect(f.cnRatio, slug).toBe(cn);
      expect(f.moisturePct, slug).toBe(moisture);
      expect(f.bulkDensityKgM3!, slug).toBeCloseTo(lbGal * LB_GAL, 1);
      expect(f.referenceSource, slug).toMatch(/Bertrand/);
    }
  });

  it('every material with a NRAES-54 Table A.1 range lies inside it (REFERENCES §1b, from memory)', () => {
    // [slug, %N range, C:N range, moisture range]; null where §1b gives none.
    type R = [number, number] | null;
    const ranges: [string, R, R, R][] = [
      ['grass-clippings', [2, 6], [9, 25], null],
      ['dry-leaves', [0.5, 1.3], [40, 80], [38, 38]],
      ['straw', [0.3, 1.1], [48, 150], [4, 27]],
      ['sawdust-untreated', [0.06, 0.8], [200, 750], [19, 65]],
      ['shredded-newspaper', [0.06, 0.14], [398, 852], [3, 8]],
      ['cardboard', [0.1, 0.1], [560, 563], [8, 8]],
      ['horse-manure', [1.4, 2.3], [22, 50], [59, 79]],
      ['cattle-manure', [1.5, 4.2], [11, 30], [67, 87]],
      ['shredded-prunings', [0.04, 0.23], [212, 1313], [15, 40]],
    ];
    const inside = (v: number | null, r: R) => r === null || (v !== null && v >= r[0] && v <= r[1]);
    for (const [slug, n, cn, m] of ranges) {
      const f = feedstock(slug)!;
      expect(inside(f.nitrogenPct, n), `${slug} %N`).toBe(true);
      expect(inside(f.cnRatio, cn), `${slug} C:N`).toBe(true);
      expect(inside(f.moisturePct, m), `${slug} moisture`).toBe(true);
    }
    // Estimates said to lie inside the fruit-waste / vegetable-produce ranges really do (§1b, low confidence).
    for (const f of DEMO_FEEDSTOCKS) {
      if (/fruit-waste range/.test(f.referenceSource)) {
        expect(inside(f.nitrogenPct, [0.9, 2.6]), f.slug).toBe(true);
        expect(inside(f.cnRatio, [20, 49]), f.slug).toBe(true);
        expect(inside(f.moisturePct, [62, 88]), f.slug).toBe(true);
      }
      if (/vegetable-produce range/.test(f.referenceSource)) {
        expect(inside(f.nitrogenPct, [2.5, 4]), f.slug).toBe(true);
        expect(inside(f.cnRatio, [11, 13]), f.slug).toBe(true);
      }
    }
  });
});

describe('demo scenario: trials', () => {
  it('has at least 90 trials with unique keys and valid references', () => {
    expect(DEMO_TRIALS.length).toBeGreaterThanOrEqual(90);
    expect(new Set(DEMO_TRIALS.map((t) => t.key)).size).toBe(DEMO_TRIALS.length);
    for (const t of DEMO_TRIALS) {
      expect(feedstock(t.feedstockSlug), t.key).toBeDefined();
      expect(person(t.ownerKey), t.key).toBeDefined();
      expect(DEMO_SITES.some((s) => s.key === t.siteKey), t.key).toBe(true);
    }
  });

  it('comes from at least 6 owners who are contributors or above, 6 of them plain contributors', () => {
    const owners = new Set(DEMO_TRIALS.map((t) => t.ownerKey));
    expect(owners.size).toBeGreaterThanOrEqual(6);
    for (const o of owners) expect(CONTRIBUTOR_OR_ABOVE, o).toContain(person(o)!.role);
    expect([...owners].filter((o) => person(o)!.role === 'contributor').length).toBeGreaterThanOrEqual(6);
  });

  it('covers every setting and has running, closed and abandoned trials', () => {
    for (const s of SETTINGS) expect(DEMO_TRIALS.some((t) => t.setting === s), s).toBe(true);
    expect(DEMO_TRIALS.filter((t) => t.status === 'running').length).toBeGreaterThanOrEqual(12);
    expect(DEMO_TRIALS.filter((t) => t.status === 'abandoned').length).toBeGreaterThanOrEqual(1);
    expect(DEMO_TRIALS.filter((t) => t.status === 'closed').length).toBeGreaterThan(0);
  });

  it('has 2–10 check-ins on schedule, after the start, increasing, within Feb–Nov 2026', () => {
    for (const t of DEMO_TRIALS) {
      expect(t.checkIns.length, t.key).toBeGreaterThanOrEqual(2);
      expect(t.checkIns.length, t.key).toBeLessThanOrEqual(10);
      expect(t.startDate >= '2026-02-01', t.key).toBe(true);
      let prev = t.startDate;
      for (const c of t.checkIns) {
        expect(c.date, t.key).toMatch(/^\d{4}-\d{2}-\d{2}$/);
        expect(c.date > prev, `${t.key} ${c.date} after ${prev}`).toBe(true);
        expect(daysAfterStart(t, c) % t.checkInEveryDays, `${t.key} ${c.date} on schedule`).toBe(0);
        prev = c.date;
      }
      expect(last(t.checkIns).date <= DEMO_TODAY, t.key).toBe(true);
      expect(DEMO_TODAY).toBe('2026-11-28');
    }
  });

  it('keeps check-in values in range and the share remaining non-increasing', () => {
    for (const t of DEMO_TRIALS) {
      let prev = 100;
      for (const c of t.checkIns) {
        expect(c.shareRemainingPct, t.key).toBeGreaterThanOrEqual(0);
        expect(c.shareRemainingPct, t.key).toBeLessThanOrEqual(100);
        expect(c.shareRemainingPct, `${t.key} ${c.date}`).toBeLessThanOrEqual(prev);
        prev = c.shareRemainingPct;
        if (c.pH !== null) {
          expect(c.pH).toBeGreaterThanOrEqual(3.5);
          expect(c.pH).toBeLessThanOrEqual(9.5);
        }
        if (c.bedTempC !== null) {
          expect(c.bedTempC).toBeGreaterThanOrEqual(0);
          expect(c.bedTempC).toBeLessThanOrEqual(40);
        }
        expect(new Set(c.pests).size, t.key).toBe(c.pests.length);
        expect(c.notes.length, t.key).toBeGreaterThan(0);
      }
    }
  });

  it('sets outcome and close reason according to status', () => {
    for (const t of DEMO_TRIALS) {
      if (t.status === 'closed') {
        expect(t.confirmedOutcome, t.key).not.toBeNull();
        expect(t.closeReason, t.key).toBeTruthy();
      } else {
        expect(t.confirmedOutcome, t.key).toBeNull();
      }
      if (t.status === 'running') expect(t.closeReason, t.key).toBeNull();
      if (t.status === 'abandoned') expect(t.closeReason, t.key).toBeTruthy();
      if (t.status === 'running') expect(t.startDate >= '2026-09-15', `${t.key} is recent`).toBe(true);
    }
  });

  it('has outcomes coherent with the check-ins', () => {
    for (const t of DEMO_TRIALS) {
      const end = last(t.checkIns);
      const anyHarm = t.checkIns.some((c) => c.wormDeaths || c.exodus);
      switch (t.confirmedOutcome) {
        case 'consumed':
          expect(end.shareRemainingPct, t.key).toBeLessThanOrEqual(10);
          expect(['many', 'swarming'], t.key).toContain(end.wormActivity);
          break;
        case 'rejected':
          expect(end.shareRemainingPct, t.key).toBeGreaterThanOrEqual(70);
          for (const c of t.checkIns) expect(['none', 'few'], t.key).toContain(c.wormActivity);
          break;
        case 'partial':
          expect(end.shareRemainingPct, t.key).toBeGreaterThan(10);
          expect(end.shareRemainingPct, t.key).toBeLessThan(70);
          break;
        case 'harm':
          expect(anyHarm, t.key).toBe(true);
          break;
        default:
          break;
      }
      if (t.confirmedOutcome !== 'harm') expect(anyHarm, `${t.key} has deaths/exodus but is not harm`).toBe(false);
    }
  });

  it('heats only big, thick doses; small doses stay cool', () => {
    for (const t of DEMO_TRIALS) {
      const hot = t.checkIns.some((c) => (c.bedTempC ?? 0) >= 30);
      if (hot) expect(loadKgM2(t), `${t.key} heated at a small load`).toBeGreaterThanOrEqual(3.5);
      if (loadKgM2(t) < 2) expect(hot, `${t.key} small dose heated`).toBe(false);
    }
    // Some big doses do heat into the 30s.
    expect(DEMO_TRIALS.filter((t) => t.checkIns.some((c) => (c.bedTempC ?? 0) >= 30)).length).toBeGreaterThanOrEqual(5);
  });

  it('keeps cold-limited species warm', () => {
    for (const t of DEMO_TRIALS.filter((x) => x.species === 'perionyx-excavatus' || x.species === 'eudrilus-eugeniae')) {
      for (const c of t.checkIns) if (c.bedTempC !== null) expect(c.bedTempC, t.key).toBeGreaterThanOrEqual(12);
    }
  });

  it('uses realistic doses and areas for each setting, in mixed units', () => {
    for (const t of DEMO_TRIALS) {
      const fs = feedstock(t.feedstockSlug)!;
      if (['L', 'mL', 'gal', 'qt'].includes(t.dose.unit)) expect(fs.bulkDensityKgM3, `${t.key} volume dose`).not.toBeNull();
      const kg = doseKg(t);
      if (t.setting === 'bin') {
        expect(t.surfaceAreaM2, t.key).toBeGreaterThanOrEqual(0.1);
        expect(t.surfaceAreaM2, t.key).toBeLessThanOrEqual(0.5);
        expect(kg, t.key).toBeGreaterThanOrEqual(0.2);
        expect(kg, t.key).toBeLessThanOrEqual(2);
      } else if (t.setting === 'flow-through') {
        expect(t.surfaceAreaM2, t.key).toBeGreaterThanOrEqual(0.5);
        expect(t.surfaceAreaM2, t.key).toBeLessThanOrEqual(1.5);
        expect(kg, t.key).toBeLessThanOrEqual(10);
      } else {
        expect(t.surfaceAreaM2, t.key).toBeGreaterThanOrEqual(1);
        expect(t.surfaceAreaM2, t.key).toBeLessThanOrEqual(6);
        expect(kg, t.key).toBeLessThanOrEqual(40);
      }
      expect(kg, t.key).toBeGreaterThan(0);
      expect(t.photoCount, t.key).toBeGreaterThanOrEqual(0);
    }
    const units = new Set(DEMO_TRIALS.map((t) => t.dose.unit));
    for (const u of ['kg', 'g', 'lb', 'oz', 'L', 'mL', 'gal', 'qt']) expect(units.has(u as never), u).toBe(true);
  });

  it('pairs trials within one feedstock, symmetrically, with controls on the reference plots', () => {
    const paired = DEMO_TRIALS.filter((t) => t.pairedTrialKey !== null);
    expect(paired.length).toBeGreaterThanOrEqual(8);
    for (const t of paired) {
      const other = trial(t.pairedTrialKey!);
      expect(other, t.key).toBeDefined();
      expect(other!.key, t.key).not.toBe(t.key);
      expect(other!.feedstockSlug, t.key).toBe(t.feedstockSlug);
      expect(other!.pairedTrialKey, t.key).toBe(t.key);
      expect(other!.setting, t.key).toBe(t.setting);
      expect(t.isControl && other!.isControl, `${t.key}: both arms are controls`).toBe(false);
    }
    for (const t of DEMO_TRIALS.filter((x) => x.isControl)) expect(t.pairedTrialKey, t.key).not.toBeNull();
    expect(DEMO_TRIALS.filter((t) => t.isControl).length).toBeGreaterThanOrEqual(2);
    // prepared vs raw
    expect(paired.some((t) => t.preparation === 'pre-composted' && trial(t.pairedTrialKey!)!.preparation === 'raw')).toBe(true);
    // home-grown vs store-bought citrus
    expect(
      paired.some(
        (t) => t.feedstockSlug === 'orange-peel' && t.provenance === 'home-grown' && trial(t.pairedTrialKey!)!.provenance === 'store-bought',
      ),
    ).toBe(true);
  });

  it('includes the extreme open-bed citrus bucket: no worms 3+ weeks, in by week 5, mostly gone by week 7', () => {
    // REFERENCES §9 (common practice, no published source).
    const t = DEMO_TRIALS.find((x) => x.feedstockSlug === 'orange-peel' && x.setting === 'bed' && doseKg(x) >= 15)!;
    expect(t).toBeDefined();
    expect(doseKg(t)).toBeLessThanOrEqual(25);
    expect(t.checkInEveryDays).toBe(7);
    expect(daysAfterStart(t, last(t.checkIns))).toBeGreaterThanOrEqual(49);
    expect(daysAfterStart(t, last(t.checkIns))).toBeLessThanOrEqual(63);
    const at = (day: number) => t.checkIns.find((c) => daysAfterStart(t, c) === day)!;
    for (const day of [7, 14, 21]) expect(at(day).wormActivity, `day ${day}`).toBe('none');
    expect(['many', 'swarming']).toContain(at(35).wormActivity);
    expect(at(49).shareRemainingPct).toBeLessThanOrEqual(15);
    expect(t.confirmedOutcome).toBe('consumed');
  });

  it('includes a land flatworm in a bed, red mites in a sour bread bin, and a fresh poultry manure harm case', () => {
    expect(DEMO_TRIALS.some((t) => t.setting === 'bed' && t.checkIns.some((c) => c.pests.includes('land-flatworms')))).toBe(true);
    expect(
      DEMO_TRIALS.some(
        (t) =>
          t.feedstockSlug === 'bread' &&
          t.setting === 'bin' &&
          t.checkIns.some((c) => c.pests.includes('mites')) &&
          t.checkIns.some((c) => c.smell === 'sour'),
      ),
    ).toBe(true);
    const poultry = DEMO_TRIALS.find((t) => t.feedstockSlug === 'poultry-manure' && t.confirmedOutcome === 'harm')!;
    expect(poultry.setting).toBe('bin');
    expect(poultry.preparation).toBe('raw');
    expect(poultry.checkIns.some((c) => c.wormDeaths)).toBe(true);
    expect(DEMO_TRIALS.some((t) => t.checkIns.some((c) => c.pests.includes('springtails')))).toBe(true);
  });

  it('has settled evidence for several feedstocks and thin evidence for others', () => {
    const groups = new Map<string, DemoTrial[]>();
    for (const t of DEMO_TRIALS) {
      const k = `${t.feedstockSlug}|${t.setting}`;
      groups.set(k, [...(groups.get(k) ?? []), t]);
    }
    const strong = [...groups.values()].filter((ts) => ts.length >= 5 && new Set(ts.map((t) => t.ownerKey)).size >= 3);
    expect(new Set(strong.map((ts) => ts[0].feedstockSlug)).size).toBeGreaterThanOrEqual(6);
    const perFeedstock = new Map<string, number>();
    for (const t of DEMO_TRIALS) perFeedstock.set(t.feedstockSlug, (perFeedstock.get(t.feedstockSlug) ?? 0) + 1);
    expect([...perFeedstock.values()].filter((n) => n <= 2).length).toBeGreaterThanOrEqual(10);
  });

  it('has published verdicts that deliberately disagree with the evidence', () => {
    const bedCitrus = DEMO_TRIALS.filter((t) => t.feedstockSlug === 'orange-peel' && t.setting === 'bed' && t.status === 'closed');
    expect(feedstock('orange-peel')!.published.find((p) => p.setting === 'bed')!.verdict).toBe('avoid');
    expect(bedCitrus.filter((t) => t.confirmedOutcome === 'consumed').length).toBeGreaterThanOrEqual(4);
    expect(bedCitrus.some((t) => t.confirmedOutcome === 'harm')).toBe(false);
    const binCoffee = DEMO_TRIALS.filter((t) => t.feedstockSlug === 'coffee-grounds' && t.setting === 'bin');
    expect(feedstock('coffee-grounds')!.published.find((p) => p.setting === 'bin')!.verdict).toBe('limit');
    expect(binCoffee.length).toBeGreaterThanOrEqual(5);
    expect(binCoffee.every((t) => t.confirmedOutcome === 'consumed')).toBe(true);
  });
});

describe('demo scenario: proposals and requests', () => {
  it('has 3–5 open proposals citing trials of their own feedstock', () => {
    expect(DEMO_PROPOSALS.length).toBeGreaterThanOrEqual(3);
    expect(DEMO_PROPOSALS.length).toBeLessThanOrEqual(5);
    expect(new Set(DEMO_PROPOSALS.map((p) => p.key)).size).toBe(DEMO_PROPOSALS.length);
    const codes = new Set<string>(DEMO_CAUTION_CODES);
    for (const p of DEMO_PROPOSALS) {
      expect(p.status).toBe('open');
      expect(feedstock(p.feedstockSlug), p.key).toBeDefined();
      expect(CONTRIBUTOR_OR_ABOVE, p.key).toContain(person(p.authorKey)!.role);
      expect(p.createdAt, p.key).toMatch(/^2026-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}[+-]\d{2}:\d{2}$/);
      expect(p.trialKeys.length, p.key).toBeGreaterThan(0);
      expect(new Set(p.trialKeys).size, p.key).toBe(p.trialKeys.length);
      for (const k of p.trialKeys) expect(trial(k)?.feedstockSlug, `${p.key} cites ${k}`).toBe(p.feedstockSlug);
      for (const s of p.settings) for (const c of s.cautions) expect(codes.has(c), `${p.key}: ${c}`).toBe(true);
      expect(new Set(p.settings.map((s) => s.setting)).size).toBe(p.settings.length);
    }
  });

  it('has 0–4 votes per proposal: one per person, never the author, only contributors and above', () => {
    for (const p of DEMO_PROPOSALS) {
      expect(p.votes.length, p.key).toBeLessThanOrEqual(4);
      const voters = p.votes.map((v) => v.voterKey);
      expect(new Set(voters).size, p.key).toBe(voters.length);
      expect(voters, p.key).not.toContain(p.authorKey);
      for (const v of p.votes) {
        const who = person(v.voterKey);
        expect(who, `${p.key} ${v.voterKey}`).toBeDefined();
        expect(CONTRIBUTOR_OR_ABOVE).toContain(who!.role);
        // Very new accounts cannot vote: every voter joined at least a month before the proposal.
        expect(Date.parse(who!.joinedAt) + 30 * 86_400_000, `${v.voterKey} too new`).toBeLessThan(Date.parse(p.createdAt));
        expect(v.reason.length).toBeGreaterThan(0);
        expect(v.reason.length).toBeLessThanOrEqual(500);
      }
    }
    expect(DEMO_PROPOSALS.some((p) => p.votes.length === 0)).toBe(true);
  });

  it('has 3–4 feedstock requests for things not already listed', () => {
    expect(DEMO_REQUESTS.length).toBeGreaterThanOrEqual(3);
    expect(DEMO_REQUESTS.length).toBeLessThanOrEqual(4);
    const known = new Set(DEMO_FEEDSTOCKS.flatMap((f) => [f.slug, f.name.toLowerCase(), ...f.aliases]));
    for (const r of DEMO_REQUESTS) {
      expect(known.has(r.name.toLowerCase()), r.name).toBe(false);
      if (r.requesterKey !== null) expect(person(r.requesterKey), r.name).toBeDefined();
      expect(r.createdAt).toMatch(/^2026-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}[+-]\d{2}:\d{2}$/);
    }
  });
});
