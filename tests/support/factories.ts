import { randomUUID } from 'node:crypto';
import { Feedstock, Proposal, User } from '@/db/models';
import type { Role } from '@/db/models/User';

const uid = () => randomUUID().slice(0, 8);

/** A user with the given role; e-mail on a reserved test domain. */
export async function buildUser(attrs: Partial<{ role: Role; name: string; email: string; createdAt: Date }> = {}) {
  const id = uid();
  return User.create({
    name: attrs.name ?? `Tester ${id}`,
    email: attrs.email ?? `tester-${id}@example.test`,
    emailVerified: new Date(),
    role: attrs.role ?? 'contributor',
    licenceAcceptedAt: attrs.role && attrs.role !== 'reader' ? new Date() : null,
    ...(attrs.createdAt ? { createdAt: attrs.createdAt } : {}),
  });
}

/** A feedstock with a unique slug and plain reference values. */
export async function buildFeedstock(attrs: Partial<{ slug: string; name: string; category: Feedstock['category']; bulkDensityKgM3: number }> = {}) {
  const id = uid();
  return Feedstock.create({
    slug: attrs.slug ?? `test-feedstock-${id}`,
    name: attrs.name ?? `Test feedstock ${id}`,
    category: attrs.category ?? 'vegetable',
    family: 'test',
    cnRatio: 15,
    nitrogenPct: 2.4,
    moisturePct: 70,
    bulkDensityKgM3: attrs.bulkDensityKgM3 ?? 235,
    referenceSource: 'test fixture',
    summary: 'A feedstock made by a test.',
    pageText: 'Made by a test.',
    handlingCautions: [],
  });
}

/**
 * A valid trial as the trial service and POST /api/trials take it: 1 kg of raw
 * feedstock on 0.25 m² of an enclosed bin (4 kg/m²). Override what a test is about.
 */
export function trialInput(feedstockId: number, overrides: Record<string, unknown> = {}) {
  return {
    feedstockId,
    setting: 'bin',
    preparation: 'raw',
    provenance: 'home-grown',
    surfaceArea: { amount: 0.25, unit: 'm2' },
    species: 'eisenia-fetida',
    dose: { amount: 1, unit: 'kg' },
    region: 'Test valley',
    startDate: '2026-10-01',
    ...overrides,
  };
}

/** An open proposal by `author` on `feedstock`. */
export async function buildProposal(feedstock: Feedstock, author: User) {
  return Proposal.create({
    feedstockId: feedstock.id,
    authorId: author.id,
    baseVerdictVersion: feedstock.verdictVersion,
    settings: [{ setting: 'bin', verdict: 'limit', ceilingKgM2: 2, cautions: ['heating'] }],
    rationale: 'Test rationale.',
  });
}
