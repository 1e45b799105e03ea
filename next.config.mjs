/** @type {import('next').NextConfig} */
const nextConfig = {
  // The ORM loads its dialect drivers dynamically; bundling it breaks that.
  serverExternalPackages: ['sequelize', 'mariadb', 'sharp'],
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
