/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  // npm test builds into its own folder so it never disturbs the build npm start serves.
  distDir: process.env.OHM_DIST_DIR || '.next',
  poweredByHeader: false,
  // Server-only packages that must not be bundled (native bits, dynamic requires).
  serverExternalPackages: ['pg', 'pg-boss', '@node-rs/argon2', 'nodemailer', 'pdf-lib', 'qrcode', 'stripe', 'file-type'],
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
