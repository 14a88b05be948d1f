// Which doors a build contains. Route and page files with a special extension are compiled only into
// builds that ask for them (OHM_BUILD_DOORS, a comma list), never into the one `npm start` serves:
//   test   route.testhooks.ts  — the test suite's clock and payments-endpoint hooks (scripts/test.sh)
//   dev    page.devonly.tsx    — the dev mailbox (scripts/test.sh, `npm run dev`)
//   bench  route.benchonly.ts  — the framework-floor baselines (scripts/bench.sh)
// This file runs before the app's own code at build time, so it reads these two build settings itself;
// everything the running app reads goes through lib/env.ts.
const DOORS = { test: ['testhooks.ts'], dev: ['devonly.tsx'], bench: ['benchonly.ts'] };
const wanted = (process.env.OHM_BUILD_DOORS ?? '').split(',').map((s) => s.trim()).filter(Boolean);
for (const door of wanted) if (!(door in DOORS)) throw new Error(`OHM_BUILD_DOORS: unknown door "${door}"`);

/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  // npm test builds into its own folder so it never disturbs the build npm start serves.
  distDir: process.env.OHM_DIST_DIR || '.next',
  pageExtensions: [...wanted.flatMap((door) => DOORS[door]), 'tsx', 'ts'],
  poweredByHeader: false,
  // Server-only packages that must not be bundled (native bits, dynamic requires).
  serverExternalPackages: ['pg', 'pg-boss', 'pino', '@node-rs/argon2', 'nodemailer', 'pdf-lib', 'qrcode', 'stripe', 'file-type'],
  typedRoutes: false,
  // npm test runs `tsc --noEmit` as its own step; the build need not repeat it.
  typescript: { ignoreBuildErrors: true },
  async headers() {
    return [
      {
        source: '/:path*',
        headers: [
          { key: 'X-Content-Type-Options', value: 'nosniff' },
          { key: 'Referrer-Policy', value: 'same-origin' },
          { key: 'X-Frame-Options', value: 'DENY' },
          { key: 'Permissions-Policy', value: 'camera=(self), microphone=(), geolocation=()' },
        ],
      },
    ];
  },
};
export default nextConfig;
