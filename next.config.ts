import type { NextConfig } from 'next';

const nextConfig: NextConfig = {
  // knex and pg load drivers dynamically; bundling them breaks that.
  serverExternalPackages: ['knex', 'pg', 'sharp', 'pdfkit', 'bwip-js'],
  // Tests build into their own folder so they never disturb a running demo.
  distDir: process.env.NEXT_DIST_DIR || '.next',
  poweredByHeader: false,
  // Compression belongs to the reverse proxy in front of the app (nginx, a load balancer): done
  // here it costs every API response a gzip pass on the app's own CPU.
  compress: false,
  typedRoutes: false,
};

export default nextConfig;
