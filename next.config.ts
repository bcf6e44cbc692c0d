import type { NextConfig } from 'next';

const nextConfig: NextConfig = {
  // knex and pg load drivers dynamically; bundling them breaks that.
  serverExternalPackages: ['knex', 'pg', 'sharp', 'pdfkit', 'bwip-js'],
  // Tests build into their own folder so they never disturb a running demo.
  distDir: process.env.NEXT_DIST_DIR || '.next',
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
