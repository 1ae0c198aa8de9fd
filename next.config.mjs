// Headers on every answer. The page's own script policy (a CSP with nonces) is not set yet; this one only
// forbids framing. HSTS is sent by production servers; browsers ignore it over plain http (RFC 6797 §8.1),
// so the loopback demo is unaffected.
const securityHeaders = [
  { key: 'Content-Security-Policy', value: "frame-ancestors 'none'" },
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
  { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=(), payment=()' },
  ...(process.env.NODE_ENV === 'production'
    ? [{ key: 'Strict-Transport-Security', value: 'max-age=31536000; includeSubDomains' }]
    : []),
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  async headers() {
    return [{ source: '/:path*', headers: securityHeaders }];
  },
  // Sequelize loads its dialect with a dynamic require, and pg has an optional native module:
  // bundling either breaks at run time, so they stay plain Node packages on the server.
  serverExternalPackages: ['sequelize', 'pg', 'pg-hstore', 'sharp', 'pg-boss', 'pdfkit'],
  poweredByHeader: false,
  reactStrictMode: true,
  // forbidden() and forbidden.tsx: a signed-in person without the role sees a 403 page.
  experimental: { authInterrupts: true },
};

export default nextConfig;
