/** @type {import('next').NextConfig} */
const nextConfig = {
  // The ORM loads its dialect drivers dynamically; bundling it breaks that.
  serverExternalPackages: ['sequelize', 'mariadb', 'sharp'],
  poweredByHeader: false,
  // No body-hash ETags: hashing every cached page on every request costs more than
  // the bytes it saves (cached pages carry s-maxage; static files keep their own ETags).
  generateEtags: false,
  typedRoutes: false,
};

export default nextConfig;
