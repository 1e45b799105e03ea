import { fileURLToPath } from 'node:url';

/** @type {import('next').NextConfig} */
const nextConfig = {
  // The ORM loads its dialect drivers dynamically; bundling it breaks that.
  serverExternalPackages: ['sequelize', 'mariadb', 'sharp'],
  poweredByHeader: false,
  // No body-hash ETags: hashing every cached page on every request costs more than
  // the bytes it saves (cached pages carry s-maxage; static files keep their own ETags).
  generateEtags: false,
  typedRoutes: false,
  // Next's own page cache, storing each page's HTML in its ASCII form: written several times faster.
  cacheHandler: fileURLToPath(new URL('./lib/http/page-cache-handler.mjs', import.meta.url)),
};

export default nextConfig;
