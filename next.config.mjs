/** @type {import('next').NextConfig} */
const nextConfig = {
  // Sequelize loads its dialect with a dynamic require, and pg has an optional native module:
  // bundling either breaks at run time, so they stay plain Node packages on the server.
  serverExternalPackages: ['sequelize', 'pg', 'pg-hstore', 'sharp', 'pg-boss', 'pdfkit'],
  poweredByHeader: false,
  reactStrictMode: true,
  // forbidden() and forbidden.tsx: a signed-in person without the role sees a 403 page.
  experimental: { authInterrupts: true },
};

export default nextConfig;
