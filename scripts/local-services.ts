// The local fakes that stand in for hosted services: S3-compatible storage, an SMTP
// server that catches mail, a parcel carrier. Started by `npm start` and `npm test`.
import path from 'node:path';
import { env } from '../lib/env';
import { startFakeCarrier } from './fakes/carrier';
import { startFakeS3 } from './fakes/s3';
import { startFakeSmtp } from './fakes/smtp';

const port = (name: string, fallback: number) => Number(process.env[name] ?? fallback);
const dataDir = process.env.LOCAL_DATA_DIR ?? path.resolve('.data/local');

async function main() {
  const s3 = await startFakeS3({ port: port('LOCAL_S3_PORT', 4569), directory: path.join(dataDir, 's3'), bucket: env().S3_BUCKET });
  const smtp = await startFakeSmtp({ smtpPort: port('LOCAL_SMTP_PORT', 2525), httpPort: port('LOCAL_MAILBOX_PORT', 2580) });
  const carrier = await startFakeCarrier({
    port: port('LOCAL_CARRIER_PORT', 4600),
    apiKey: env().CARRIER_API_KEY,
    file: path.join(dataDir, 'carrier', 'shipments.json'),
    speed: Number(process.env.LOCAL_CARRIER_SPEED ?? 60),
  });
  console.log('local services ready');
  const stop = async () => {
    await Promise.allSettled([s3.close(), smtp.close(), carrier.close()]);
    process.exit(0);
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
