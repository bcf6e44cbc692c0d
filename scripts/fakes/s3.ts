import fs from 'node:fs';
import path from 'node:path';
import S3rver from 's3rver';

// Browsers upload evidence straight to the bucket with presigned PUTs, so the fake needs
// CORS like a real bucket would be configured with.
const corsXml = `<?xml version="1.0" encoding="UTF-8"?>
<CORSConfiguration xmlns="http://s3.amazonaws.com/doc/2006-03-01/">
  <CORSRule>
    <AllowedOrigin>*</AllowedOrigin>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;

export async function startFakeS3(opts: { port: number; directory: string; bucket: string }) {
  fs.mkdirSync(opts.directory, { recursive: true });
  const server = new S3rver({
    port: opts.port,
    address: '127.0.0.1',
    silent: true,
    directory: path.resolve(opts.directory),
    configureBuckets: [{ name: opts.bucket, configs: [corsXml] }],
  });
  await server.run();
  return { close: () => server.close() };
}
