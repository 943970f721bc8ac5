import type { NextConfig } from 'next';

const securityHeaders = [
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'Referrer-Policy', value: 'same-origin' },
  { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=()' },
];

const nextConfig: NextConfig = {
  // Database drivers, the job queue, native hashing and worker pools stay outside the server bundle.
  serverExternalPackages: [
    'sequelize',
    'pg',
    'pg-hstore',
    'pg-boss',
    'argon2',
    'piscina',
    'xlsx',
    'nodemailer',
  ],
  // The test command builds into its own folder so that it never disturbs a running demo.
  distDir: process.env.GATEWELL_DIST_DIR || '.next',
  poweredByHeader: false,
  typedRoutes: false,
  // forbidden() answers pages a role may not open (lib/auth/page-guard.ts).
  experimental: { authInterrupts: true, serverMinification: process.env.GATEWELL_SERVER_MINIFY !== 'off' },
  async headers() {
    return [{ source: '/:path*', headers: securityHeaders }];
  },
};

export default nextConfig;
