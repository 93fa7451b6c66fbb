#!/usr/bin/env node
// A local S3 fake (s3rver) for demo mode and tests, on 127.0.0.1, keeping objects in
// S3_FAKE_DIR. Prints {"ready":true,"port":N} once it listens.
import { mkdirSync } from 'node:fs';
import S3rver from 's3rver';

const directory = process.env.S3_FAKE_DIR;
const bucket = process.env.S3_BUCKET ?? 'emberline';
if (!directory) {
  console.error('S3_FAKE_DIR is not set');
  process.exit(2);
}
mkdirSync(directory, { recursive: true });
const server = new S3rver({
  address: '127.0.0.1',
  port: Number(process.env.S3_FAKE_PORT ?? 0),
  directory,
  silent: true,
  configureBuckets: [{ name: bucket }],
});
server
  .run()
  .then(({ port }) => console.log(JSON.stringify({ ready: true, port })))
  .catch((e) => {
    console.error(`s3 fake: ${e.message}`);
    process.exit(1);
  });
const stop = () => server.close().finally(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
