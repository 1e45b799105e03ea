import 'server-only';
import { readFile, readdir } from 'node:fs/promises';
import path from 'node:path';
import { compileMDX } from 'next-mdx-remote/rsc';
import type { ReactElement } from 'react';
import { z } from 'zod';
import { guideComponents } from '@/components/guides/mdx-components';

/**
 * Curated guides: MDX files in content/guides/<slug>.mdx with frontmatter
 * (title, description, updated). Compiled on the server with next-mdx-remote's
 * RSC API; JavaScript in the MDX is blocked (next-mdx-remote's default), only
 * the components in components/guides are available.
 */

const GUIDES_DIR = path.join(process.cwd(), 'content', 'guides');

const FrontmatterSchema = z.object({
  title: z.string().min(3).max(120),
  description: z.string().min(10).max(300),
  updated: z.union([z.string(), z.date()]).transform((v, ctx) => {
    const s = v instanceof Date ? v.toISOString().slice(0, 10) : v;
    if (!/^\d{4}-\d{2}-\d{2}$/.test(s)) {
      ctx.addIssue({ code: 'custom', message: 'updated must be a date like 2026-12-01' });
      return z.NEVER;
    }
    return s;
  }),
  order: z.number().int().optional(),
});
export type GuideMeta = z.infer<typeof FrontmatterSchema> & { slug: string };

const SLUG = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

async function compile(slug: string): Promise<{ meta: GuideMeta; content: ReactElement }> {
  const source = await readFile(path.join(GUIDES_DIR, `${slug}.mdx`), 'utf8');
  const { content, frontmatter } = await compileMDX<Record<string, unknown>>({
    source,
    components: guideComponents,
    options: { parseFrontmatter: true },
  });
  const parsed = FrontmatterSchema.safeParse(frontmatter);
  if (!parsed.success) throw new Error(`content/guides/${slug}.mdx: bad frontmatter: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
  return { meta: { ...parsed.data, slug }, content };
}

/** Every guide's frontmatter, in reading order (`order`, then title). Throws on a bad file. */
export async function listGuides(): Promise<GuideMeta[]> {
  const files = (await readdir(GUIDES_DIR)).filter((f) => f.endsWith('.mdx'));
  const metas = await Promise.all(files.map(async (f) => (await compile(f.slice(0, -4))).meta));
  return metas.sort((a, b) => (a.order ?? 99) - (b.order ?? 99) || a.title.localeCompare(b.title));
}

/** One guide, compiled; null when there is no such guide. */
export async function getGuide(slug: string): Promise<{ meta: GuideMeta; content: ReactElement } | null> {
  if (!SLUG.test(slug)) return null;
  try {
    return await compile(slug);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw err;
  }
}
