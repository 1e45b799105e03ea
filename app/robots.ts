import type { MetadataRoute } from 'next';

/** Crawlers may read the public pages; editing, review, account and API routes are not for indexing. */
export default function robots(): MetadataRoute.Robots {
  const base = (process.env.AUTH_URL ?? 'http://localhost:3000').replace(/\/$/, '');
  return {
    rules: [{ userAgent: '*', allow: '/', disallow: ['/api/', '/review/', '/account', '/admin/', '/signin', '/search', '/feedstocks/*/edit', '/feedstocks/*/manage'] }],
    sitemap: `${base}/sitemap.xml`,
  };
}
